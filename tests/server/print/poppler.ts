import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// Debian's poppler-utils read our PDFs back as an outside check. CI installs them
// (REQUIRE_BROWSER=1 makes their absence a failure); elsewhere the tests that need
// them are skipped with this reason.
export const hasPoppler = spawnSync('pdfinfo', ['-v']).status === 0;
export const popplerSkipReason = 'poppler-utils (pdfinfo, pdffonts, pdftotext) not installed: apt-get install -y poppler-utils';
if (!hasPoppler && process.env.REQUIRE_BROWSER === '1') throw new Error(`REQUIRE_BROWSER=1 but ${popplerSkipReason}`);

const dir = mkdtempSync(join(tmpdir(), 'sw-print-'));
let n = 0;

export function writeTemp(pdf: Buffer): string {
  const file = join(dir, `f${n++}.pdf`);
  writeFileSync(file, pdf);
  return file;
}

export function pdfinfo(file: string): { pages: number; widthPt: number; heightPt: number } {
  const out = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
  const pages = Number(/^Pages:\s+(\d+)/m.exec(out)?.[1]);
  const size = /^Page size:\s+([\d.]+) x ([\d.]+) pts/m.exec(out);
  return { pages, widthPt: Number(size?.[1]), heightPt: Number(size?.[2]) };
}

export type FontRow = { name: string; type: string; emb: boolean };

export function pdffonts(file: string): FontRow[] {
  const out = execFileSync('pdffonts', [file], { encoding: 'utf8' });
  const lines = out.split('\n').slice(2).filter((l) => l.trim() !== '');
  // columns: name type encoding emb sub uni object ID (name has no spaces for embedded subsets)
  return lines.map((l) => {
    const cols = l.trim().split(/\s+/);
    const emb = cols[cols.length - 5];
    return { name: cols[0] ?? '', type: cols.slice(1, cols.length - 6).join(' '), emb: emb === 'yes' };
  });
}

export function pdftotext(file: string, page?: number): string {
  const args = page ? ['-f', String(page), '-l', String(page), file, '-'] : [file, '-'];
  return execFileSync('pdftotext', args, { encoding: 'utf8' });
}
