import { Fragment, isValidElement, type ReactElement, type ReactNode } from 'react';
import { PRINT_FONTS } from '../../platform/pdf/fonts';

// The SVG of a placeable graphic, written from the very drawing elements the PDF is made of
// (@react-pdf/renderer's SVG primitives: SVG, G, RECT, LINE, TEXT, PATH, POLYLINE, CIRCLE),
// so the SVG and the PDF cannot differ. Units are points (width and height say "pt").
// Colours stay the screen's RGB: an SVG is for the web and for placing; the press colours
// are in the PDF.

const ATTRS: Record<string, string> = {
  x: 'x',
  y: 'y',
  x1: 'x1',
  y1: 'y1',
  x2: 'x2',
  y2: 'y2',
  cx: 'cx',
  cy: 'cy',
  r: 'r',
  d: 'd',
  points: 'points',
  width: 'width',
  height: 'height',
  viewBox: 'viewBox',
  transform: 'transform',
  fill: 'fill',
  stroke: 'stroke',
  strokeWidth: 'stroke-width',
  strokeLinecap: 'stroke-linecap',
  strokeLinejoin: 'stroke-linejoin',
  textAnchor: 'text-anchor',
  fontFamily: 'font-family',
  fontWeight: 'font-weight',
  fontSize: 'font-size',
};
const TAGS: Record<string, string> = { SVG: 'svg', G: 'g', RECT: 'rect', LINE: 'line', TEXT: 'text', TSPAN: 'tspan', PATH: 'path', POLYLINE: 'polyline', POLYGON: 'polygon', CIRCLE: 'circle' };
const FONT_FALLBACKS: Record<string, string> = { [PRINT_FONTS.sans]: `'${PRINT_FONTS.sans}', 'Helvetica Neue', Arial, sans-serif`, [PRINT_FONTS.serif]: `'${PRINT_FONTS.serif}', Georgia, serif` };

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const num = (v: unknown) => (typeof v === 'number' ? String(Math.round(v * 1000) / 1000) : String(v));

function write(node: ReactNode, out: string[]): void {
  if (node === null || node === undefined || typeof node === 'boolean') return;
  if (typeof node === 'string' || typeof node === 'number') {
    out.push(esc(String(node)));
    return;
  }
  if (Array.isArray(node)) {
    for (const n of node as ReactNode[]) write(n, out);
    return;
  }
  if (!isValidElement(node)) return;
  const el = node as ReactElement<Record<string, unknown>>;
  if (el.type === Fragment) {
    write(el.props.children as ReactNode, out);
    return;
  }
  const tag = typeof el.type === 'string' ? TAGS[el.type] : undefined;
  if (!tag) throw new Error(`print: no SVG for the drawing element ${String(el.type)}`);
  const attrs: string[] = [];
  for (const [k, v] of Object.entries(el.props)) {
    const name = ATTRS[k];
    if (!name || v === undefined || v === null) continue;
    const value = k === 'fontFamily' ? (FONT_FALLBACKS[String(v)] ?? String(v)) : num(v);
    attrs.push(`${name}="${esc(value)}"`);
  }
  out.push(`<${tag}${attrs.length > 0 ? ` ${attrs.join(' ')}` : ''}>`);
  write(el.props.children as ReactNode, out);
  out.push(`</${tag}>`);
}

/** A standalone SVG document of drawing parts stacked at their y offsets (points). */
export function graphicSvg(parts: { svg: ReactElement; y: number }[], widthPt: number, heightPt: number, title: string): string {
  const out: string[] = [];
  const w = num(widthPt);
  const h = num(heightPt);
  out.push('<?xml version="1.0" encoding="UTF-8"?>\n');
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${w}pt" height="${h}pt" viewBox="0 0 ${w} ${h}">`);
  out.push(`<title>${esc(title)}</title>`);
  for (const p of parts) {
    out.push(`<g transform="translate(0 ${num(p.y)})">`);
    write(p.svg, out);
    out.push('</g>');
  }
  out.push('</svg>\n');
  return out.join('');
}
