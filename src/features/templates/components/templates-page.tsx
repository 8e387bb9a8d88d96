import { useState } from 'react';
import { useTemplates } from '../../../api/templates';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Card, Loading, Page } from '../../../components/page';

/** /admin/templates: the page templates (templates/pages) and a sample page of each. */
export function TemplatesPage() {
  const list = useTemplates();
  const [shown, setShown] = useState<string | null>(null);
  return (
    <Page title="Templates" description="Page templates are files in templates/pages, checked when the server starts. Each sample page is rendered with the template’s real sizes.">
      {list.isPending ? (
        <Loading />
      ) : list.error ? (
        <ErrorAlert error={list.error} />
      ) : (
        <div className="grid gap-4 lg:grid-cols-3">
          {list.data.map(({ template: t, pageWidthMm, pageHeightMm, columnWidthMm }) => (
            <Card key={t.id} title={t.name}>
              <p className="text-sm text-ink-muted">{t.description}</p>
              <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-sm tabular-nums">
                <dt>Trim</dt>
                <dd>{`${t.trim.widthMm} × ${t.trim.heightMm} mm`}</dd>
                <dt>Bleed</dt>
                <dd>{`${t.bleedMm} mm (page ${pageWidthMm.toFixed(1)} × ${pageHeightMm.toFixed(1)} mm)`}</dd>
                <dt>Margins</dt>
                <dd>{`${t.marginsMm.top} / ${t.marginsMm.right} / ${t.marginsMm.bottom} / ${t.marginsMm.left} mm`}</dd>
                <dt>Columns</dt>
                <dd>{`${t.columns} × ${columnWidthMm.toFixed(1)} mm, gutter ${t.gutterMm} mm`}</dd>
                <dt>Type</dt>
                <dd>{`title ${t.type.titlePt} · body ${t.type.bodyPt} · caption ${t.type.captionPt} · digits ≤ ${t.type.digitsPt} pt`}</dd>
                <dt>Legibility floor</dt>
                <dd>{`digits ${t.minimums.digitPt} pt, squares ${t.minimums.squareMm} mm`}</dd>
                <dt>Puzzles</dt>
                <dd>{`at most ${t.maxSlots}`}</dd>
              </dl>
              <div className="flex gap-2">
                <Button size="sm" onClick={() => setShown(shown === t.id ? null : t.id)} aria-expanded={shown === t.id}>
                  {shown === t.id ? 'Hide sample page' : 'Show sample page'}
                </Button>
                <a href={`/api/templates/${t.id}/sample.pdf`} target="_blank" rel="noreferrer" className="text-sm">
                  Open sample PDF
                </a>
              </div>
              {shown === t.id ? <iframe title={`Sample page: ${t.name}`} src={`/api/templates/${t.id}/sample.pdf`} className="h-[32rem] w-full rounded border border-rule" /> : null}
            </Card>
          ))}
        </div>
      )}
    </Page>
  );
}
