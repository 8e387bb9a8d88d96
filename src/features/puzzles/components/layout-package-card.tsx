import { useState } from 'react';
import type { PuzzleDetail } from '../../../../shared/contracts/puzzles';
import { usePublications } from '../../../api/publications';
import { ErrorAlert } from '../../../components/alert';
import { buttonClasses } from '../../../components/button';
import { Card, Loading } from '../../../components/page';
import { SelectField } from '../../../components/select-field';

/**
 * The puzzle for a desk's own page layout: a zip with the puzzle and its solution as PDF/X
 * and SVG at a publication's type and line settings, instructions and solution as text, and a
 * manifest. The PNG on the stock page stays for the web.
 */
export function LayoutPackageCard({ p }: { p: PuzzleDetail }) {
  const pubs = usePublications();
  const [chosen, setChosen] = useState('');
  if (pubs.isPending) return <Card title="Package for layout"><Loading /></Card>;
  if (pubs.error) return <Card title="Package for layout"><ErrorAlert error={pubs.error} /></Card>;
  const publicationId = chosen || pubs.data[0]?.id || '';
  const href = `/api/puzzles/${p.id}/layout-package.zip?publicationId=${encodeURIComponent(publicationId)}`;
  return (
    <Card title="Package for layout">
      <p className="text-sm text-ink-muted">
        The puzzle and its solution as placeable PDF/X and SVG files at a publication's type and line settings, the instructions and the solution as plain text, and a manifest. Check the files
        before they go to press.
      </p>
      {pubs.data.length === 0 ? (
        <p className="text-sm text-ink-muted">Create a publication first: the package takes its settings from one.</p>
      ) : (
        <div className="flex flex-wrap items-end gap-3">
          <SelectField label="Settings of" value={publicationId} onChange={(e) => setChosen(e.target.value)} options={pubs.data.map((x) => ({ value: x.id, label: `${x.title} (${x.templateId})` }))} />
          <a
            href={href}
            download
            className={buttonClasses('secondary', 'md')}
          >
            Download package (.zip)
          </a>
        </div>
      )}
    </Card>
  );
}
