import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';

// The print module reads fonts/ and templates/ from the app root, never relative to
// import.meta.url (paths move when the server is bundled). APP_ROOT wins; otherwise the
// nearest folder upwards from the working directory whose package.json is ours.
let cached: string | undefined;

export function printAppRoot(): string {
  if (cached) return cached;
  const fromEnv = process.env.APP_ROOT;
  if (fromEnv) {
    cached = resolve(fromEnv);
    return cached;
  }
  let dir = process.cwd();
  for (;;) {
    const pkg = join(dir, 'package.json');
    if (existsSync(pkg)) {
      try {
        const name = (JSON.parse(readFileSync(pkg, 'utf8')) as { name?: unknown }).name;
        if (name === 'squarewright') {
          cached = dir;
          return dir;
        }
      } catch {
        // not our package.json; keep looking upwards
      }
    }
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  cached = process.cwd();
  return cached;
}
