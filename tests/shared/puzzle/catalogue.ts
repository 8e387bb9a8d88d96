// Loads the published catalogue fixtures (tests/fixtures/puzzle/, see its README for the source).
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseTiling } from '../../../shared/tiling/index';
import type { Tiling } from '../../../shared/tiling/index';

const dir = fileURLToPath(new URL('../../fixtures/puzzle/', import.meta.url));

export function catalogue(order: number): { code: string; tiling: Tiling }[] {
  return readFileSync(`${dir}o${order}spsr.bkp`, 'utf8')
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l.length > 0)
    .map((code) => ({ code, tiling: parseTiling(code) }));
}
