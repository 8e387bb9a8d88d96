import { z } from 'zod';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';

/** The fields of a package.json we read (others ignored; a non-string counts as absent). */
const packageJsonSchema = z.object({ name: z.string().optional().catch(undefined), version: z.string().optional().catch(undefined) });

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
        if (packageJsonSchema.parse(JSON.parse(readFileSync(pkg, 'utf8'))).name === 'squarewright') {
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
  return packageJsonSchema.parse(JSON.parse(readFileSync(fromRoot('package.json'), 'utf8'))).version ?? '0.0.0';
}
