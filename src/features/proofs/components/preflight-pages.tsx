import type { PreflightReport } from '../../../../shared/contracts/preflight';
import { PlainTable } from '../../../components/plain-table';

const fmt = (v: number | null | undefined, unit: string) => (v === null || v === undefined ? '—' : `${v} ${unit}`);

/**
 * The preflight of a proof as a plant reads it: the PDF/X identification and output intent,
 * then per page the boxes, bleed, colour spaces, fonts, smallest type and thinnest line.
 * Reports stored before PDF/X (issue 17) have none of it: nothing is shown then.
 */
export function PreflightPages({ preflight }: { preflight: PreflightReport }) {
  const x = preflight.pdfx;
  const pages = preflight.pageReports;
  if (!x || !pages) return null;
  const intent = x.outputIntent;
  return (
    <details className="text-sm">
      <summary className="cursor-pointer font-medium text-ink">Preflight page by page</summary>
      <p className="mt-2 text-ink-soft">
        {`${x.version ?? 'No PDF/X identification'} (PDF ${x.pdfVersion}) · output intent ${intent ? `${intent.identifier ?? '?'}${intent.profileEmbedded ? ', profile embedded' : intent.registry ? `, registered at ${intent.registry}` : ''}` : 'missing'} · Trapped ${x.trapped ?? 'missing'} · document ID ${x.documentId ? 'present' : 'missing'} · XMP ${x.xmp ? 'present' : 'missing'}`}
      </p>
      <div className="mt-2 overflow-x-auto">
        <PlainTable caption="Preflight of each page" headings={['Page', 'Trim', 'Bleed', 'Boxes nested', 'Colour spaces', 'Fonts embedded', 'Smallest type', 'Thinnest line', 'Off the black plate']} dense>
          {pages.map((p) => (
            <tr key={p.page} className="border-t border-rule">
              <td className="px-2 py-1 tabular-nums">{p.page}</td>
              <td className="px-2 py-1 tabular-nums whitespace-nowrap">{p.trimMm ? `${p.trimMm.width} × ${p.trimMm.height} mm` : 'no TrimBox'}</td>
              <td className="px-2 py-1 tabular-nums whitespace-nowrap">{p.bleedMm ? `${Math.min(...Object.values(p.bleedMm))} mm` : '—'}</td>
              <td className="px-2 py-1">{p.boxesNested ? 'yes' : 'NO'}</td>
              <td className="px-2 py-1">{p.colourSpaces.join(', ') || '—'}</td>
              <td className="px-2 py-1 tabular-nums">{`${p.fonts.filter((f) => f.embedded).length} of ${p.fonts.length}`}</td>
              <td className="px-2 py-1 tabular-nums">{fmt(p.smallestTypePt, 'pt')}</td>
              <td className="px-2 py-1 tabular-nums">{fmt(p.thinnestLinePt, 'pt')}</td>
              <td className="px-2 py-1 tabular-nums">{p.offBlackPlate === 0 ? 'none' : `${p.offBlackPlate} runs or lines`}</td>
            </tr>
          ))}
        </PlainTable>
      </div>
    </details>
  );
}
