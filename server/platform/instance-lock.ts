import { closeSync, mkdirSync, openSync, readFileSync, unlinkSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { z } from 'zod';

// One server per data folder (decision 032). The first thing a server does with DATA_DIR is
// create DATA_DIR/server.lock exclusively (O_EXCL), holding its pid and host; it removes the
// file when it stops. A second server finds the file, sees that the process it names is alive,
// and refuses to start before it has opened the database or touched anything else. A file left
// by a server that died (its pid no longer runs on this host) is taken over.

export const LOCK_FILE = 'server.lock';

const lockSchema = z.object({ pid: z.number().int(), host: z.string(), startedAt: z.string() });

export class InstanceLockError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'InstanceLockError';
  }
}

export interface InstanceLock {
  file: string;
  release(): void;
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    // EPERM: it exists but belongs to someone else
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Take the data folder for this process, or throw InstanceLockError naming the server that holds it. */
export function lockDataDir(dataDir: string): InstanceLock {
  mkdirSync(dataDir, { recursive: true });
  const file = join(dataDir, LOCK_FILE);
  const me = { pid: process.pid, host: hostname(), startedAt: new Date().toISOString() };
  for (let attempt = 0; attempt < 3; attempt++) {
    let fd: number;
    try {
      fd = openSync(file, 'wx', 0o644);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      let held: z.infer<typeof lockSchema> | null = null;
      try {
        const r = lockSchema.safeParse(JSON.parse(readFileSync(file, 'utf8')));
        held = r.success ? r.data : null;
      } catch {
        held = null; // being written right now, or not ours: look again
      }
      if (held && held.host !== me.host) {
        throw new InstanceLockError(`Another Squarewright server (pid ${held.pid} on ${held.host}, since ${held.startedAt}) holds ${dataDir}. Stop it, or start this one with another DATA_DIR. If no server runs there, delete ${file}.`);
      }
      if (held && alive(held.pid)) {
        throw new InstanceLockError(`Another Squarewright server (pid ${held.pid}, since ${held.startedAt}) is running on ${dataDir}. Stop it first, or start this one with another DATA_DIR.`);
      }
      if (!held && attempt === 0) {
        // a lock being written this very moment: give the other server a moment
        const until = Date.now() + 200;
        while (Date.now() < until) { /* wait */ }
        continue;
      }
      // a lock left by a server that is gone: take it over
      try {
        unlinkSync(file);
      } catch {
        // someone else took it over first: the next attempt sees theirs
      }
      continue;
    }
    writeSync(fd, JSON.stringify(me));
    closeSync(fd);
    let released = false;
    const release = () => {
      if (released) return;
      released = true;
      process.off('exit', release);
      try {
        const r = lockSchema.safeParse(JSON.parse(readFileSync(file, 'utf8')));
        if (r.success && r.data.pid === me.pid && r.data.startedAt === me.startedAt) unlinkSync(file);
      } catch {
        // gone already
      }
    };
    process.on('exit', release);
    return { file, release };
  }
  throw new InstanceLockError(`Could not take ${file}: another server keeps taking it.`);
}
