import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';

// The app root is the folder holding our package.json. It is found from the working
// directory (or APP_ROOT), never from import.meta.url: paths move when the server is bundled.
let cached: string | undefined;

export function appRoot(): string {
  if (cached) return cached;
  const start = resolve(process.env.APP_ROOT ?? process.cwd());
  let dir = start;
  for (;;) {
    const pkg = join(dir, 'package.json');
    if (existsSync(pkg)) {
      try {
        const parsed = JSON.parse(readFileSync(pkg, 'utf8')) as { name?: unknown };
        if (parsed.name === 'squarewright') {
          cached = dir;
          return dir;
        }
      } catch {
        // not our package.json; keep walking up
      }
    }
    const parent = dirname(dir);
    if (parent === dir) throw new Error(`cannot find the Squarewright app root above ${start} (set APP_ROOT)`);
    dir = parent;
  }
}

export function fromRoot(...parts: string[]): string {
  return join(appRoot(), ...parts);
}

export function appVersion(): string {
  const parsed = JSON.parse(readFileSync(fromRoot('package.json'), 'utf8')) as { version?: unknown };
  return typeof parsed.version === 'string' ? parsed.version : '0.0.0';
}
