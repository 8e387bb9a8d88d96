import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { pageTemplateSchema, templateGeometry } from '../../../shared/contracts/templates';
import { loadPageTemplates, parseTemplateFile, TemplateFileError } from '../../../server/areas/print/templates';

const shipped = loadPageTemplates();

function a4Raw(): Record<string, unknown> {
  return JSON.parse(JSON.stringify(shipped.get('a4'))) as Record<string, unknown>;
}

describe('page templates', () => {
  it('ships A4, US Letter and a narrow newspaper column', () => {
    expect([...shipped.keys()].sort()).toEqual(['a4', 'newspaper-column', 'us-letter']);
  });

  it('gives A4 its ISO 216 trim of 210 x 297 mm', () => {
    // ISO 216: A4 = 210 mm x 297 mm
    const t = shipped.get('a4')!;
    expect(t.trim).toEqual({ widthMm: 210, heightMm: 297 });
    expect(templateGeometry(t).pageWidthMm).toBeCloseTo(210 + 2 * t.bleedMm, 6);
  });

  it('gives US Letter its 8.5 x 11 inch trim', () => {
    // ANSI/ASME Y14.1 "A" size, US Letter = 8.5 in x 11 in; 1 in = 25.4 mm exactly (1959 international inch)
    const t = shipped.get('us-letter')!;
    expect(t.trim.widthMm).toBeCloseTo(8.5 * 25.4, 6);
    expect(t.trim.heightMm).toBeCloseTo(11 * 25.4, 6);
    // common practice in North American print: 1/8 inch bleed
    expect(t.bleedMm).toBeCloseTo(25.4 / 8, 6);
  });

  it('keeps the newspaper column narrow and single-column', () => {
    const t = shipped.get('newspaper-column')!;
    expect(t.columns).toBe(1);
    expect(t.trim.widthMm).toBeLessThan(100);
  });

  it('holds the common-practice legibility floors (digits >= 6 pt, squares >= 3 mm)', () => {
    // common practice for print legibility, not a standard
    for (const t of shipped.values()) {
      expect(t.minimums.digitPt).toBeGreaterThanOrEqual(6);
      expect(t.minimums.squareMm).toBeGreaterThanOrEqual(3);
    }
  });

  it('names the file and the field of a bad value', () => {
    const raw = a4Raw();
    (raw.trim as Record<string, unknown>).widthMm = -5;
    expect(() => parseTemplateFile('templates/pages/a4.json', JSON.stringify(raw))).toThrowError(/templates\/pages\/a4\.json[\s\S]*trim\.widthMm: trim width must be above 0 mm/);
  });

  it('rejects unknown fields and a wrong type with their paths', () => {
    const raw = a4Raw();
    raw.colour = 'red';
    (raw.type as Record<string, unknown>).bodyPt = 'ten';
    try {
      parseTemplateFile('templates/pages/a4.json', JSON.stringify(raw));
      expect.unreachable('a bad template must not load');
    } catch (e) {
      expect(e).toBeInstanceOf(TemplateFileError);
      const problems = (e as TemplateFileError).problems.join('\n');
      expect(problems).toMatch(/type\.bodyPt: body size must be a number of points/);
      expect(problems).toMatch(/colour/);
    }
  });

  it('refuses crop marks that do not fit in the bleed', () => {
    const raw = a4Raw();
    raw.cropMarks = { offsetMm: 1, lengthMm: 5 };
    expect(() => parseTemplateFile('templates/pages/a4.json', JSON.stringify(raw))).toThrowError(/cropMarks\.lengthMm: crop marks .* must fit inside the 3 mm bleed/);
  });

  it('refuses columns too narrow for a drawing', () => {
    const raw = a4Raw();
    raw.columns = 4;
    raw.gutterMm = 25;
    expect(() => parseTemplateFile('templates/pages/a4.json', JSON.stringify(raw))).toThrowError(/columns: 4 columns with a 25 mm gutter leave 26.3 mm/);
  });

  it('refuses an id that differs from the file name, and broken JSON', () => {
    expect(() => parseTemplateFile('templates/pages/b5.json', JSON.stringify(a4Raw()))).toThrowError(/id: "a4" must match the file name "b5"/);
    expect(() => parseTemplateFile('templates/pages/a4.json', '{"id": "a4",')).toThrowError(/a4\.json[\s\S]*not valid JSON/);
  });

  it('lists every bad file at once when loading a folder', () => {
    const dir = mkdtempSync(join(tmpdir(), 'sw-templates-'));
    const bad1 = a4Raw();
    bad1.id = 'one';
    bad1.bleedMm = 0;
    writeFileSync(join(dir, 'one.json'), JSON.stringify(bad1));
    const bad2 = a4Raw();
    bad2.id = 'two';
    bad2.maxSlots = 0;
    writeFileSync(join(dir, 'two.json'), JSON.stringify(bad2));
    expect(() => loadPageTemplates(dir)).toThrowError(/one\.json: bleedMm: bleed must be at least 1 mm[\s\S]*two\.json: maxSlots/);
  });

  it('accepts what it produces (schema round trip)', () => {
    for (const t of shipped.values()) expect(pageTemplateSchema.parse(JSON.parse(JSON.stringify(t)))).toEqual(t);
  });
});
