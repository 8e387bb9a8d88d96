import { chmodSync, closeSync, existsSync, mkdirSync, openSync, statSync } from 'node:fs';
import type { Logger } from './log';

// The data folder holds the database (every account, session and payout) and the generated
// auth secret: nobody but the server's own user may read them. The folder is 0700 and the
// database, its WAL files and the secret 0600 (SQLite creates -wal and -shm with the mode of
// the database file). Files of an older install are tightened at start-up.

export const PRIVATE_DIR_MODE = 0o700;
export const PRIVATE_FILE_MODE = 0o600;

/** Create the data folder 0700, or tighten an existing one (saying so in the log). */
export function privateDataDir(dir: string, log?: Pick<Logger, 'info'>): void {
  if (!existsSync(dir)) {
    mkdirSync(dir, { recursive: true, mode: PRIVATE_DIR_MODE });
  }
  const mode = statSync(dir).mode & 0o777;
  if (mode !== PRIVATE_DIR_MODE) {
    chmodSync(dir, PRIVATE_DIR_MODE);
    log?.info(`data folder ${dir}: permissions ${mode.toString(8)} -> 700 (only this user may read it)`);
  }
}

/** Create `file` empty with mode 0600 when it does not exist; tighten it (and `extra` siblings that exist) to 0600. */
export function privateFile(file: string, extra: string[] = []): void {
  if (!existsSync(file)) closeSync(openSync(file, 'a', PRIVATE_FILE_MODE));
  for (const f of [file, ...extra]) {
    if (existsSync(f) && (statSync(f).mode & 0o777) !== PRIVATE_FILE_MODE) chmodSync(f, PRIVATE_FILE_MODE);
  }
}
