import { Link } from 'react-router-dom';
import { editionStateLabels, type EditionSummary } from '../../../../shared/contracts/editions';
import { ErrorAlert } from '../../../components/alert';
import { PrintCaution } from '../../../components/caution-note';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Loading, Page } from '../../../components/page';
import { StatusBadge } from '../../../components/status-badge';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useSentEditions } from '../api/list-proofs';

function SentTable({ rows, label, press }: { rows: EditionSummary[]; label: string; press: boolean }) {
  return (
    <FramedTable caption={label} headings={['Edition', 'Date', 'State', 'Version', 'Sent', 'Pages', 'Preflight', 'File']}>
      {rows.map((e) => (
        <tr key={e.id} className="border-t border-rule">
          <td className="px-3 py-2">
            <Link to={`/proofs/${e.id}`}>{`${e.publicationTitle} No. ${e.number}`}</Link>
          </td>
          <td className="px-3 py-2 whitespace-nowrap">{formatDate(e.date)}</td>
          <td className="px-3 py-2">
            <StatusBadge tone={e.state === 'in_proof' ? 'info' : e.state === 'draft' ? 'warning' : 'success'}>{e.state === 'draft' ? 'Returned' : editionStateLabels[e.state]}</StatusBadge>
          </td>
          <td className="px-3 py-2 tabular-nums">{e.latestProofVersion ? `v${e.latestProofVersion}` : '—'}</td>
          <td className="px-3 py-2 whitespace-nowrap">{e.latestProofAt ? formatDateTime(e.latestProofAt) : '—'}</td>
          <td className="px-3 py-2 tabular-nums">{e.latestProofPages ?? '—'}</td>
          <td className="px-3 py-2">{e.latestPreflightOk === null ? '—' : `${e.latestPreflightOk ? 'Passed' : 'Failed'}${e.latestWarnings ? `, ${e.latestWarnings} warning(s)` : ''}`}</td>
          <td className="px-3 py-2">
            {press ? (
              <a href={`/api/editions/${e.id}/press.pdf?download=1`}>Download press file</a>
            ) : e.latestProofVersion ? (
              <a href={`/api/editions/${e.id}/proofs/${e.latestProofVersion}.pdf?download=1`}>{`Download v${e.latestProofVersion}`}</a>
            ) : null}
          </td>
        </tr>
      ))}
    </FramedTable>
  );
}

/** /proofs (printer): editions sent to proof, newest state first. */
export function ProofsPage() {
  const list = useSentEditions();
  const waiting = (list.data ?? []).filter((e) => e.state === 'in_proof');
  const earlier = (list.data ?? []).filter((e) => e.state === 'draft');
  return (
    <Page title="Proofs" description="Editions the desk has sent you. Download each proof, check it, and approve it or return it with your notes.">
      <PrintCaution />
      {list.isPending ? (
        <Loading />
      ) : list.error ? (
        <ErrorAlert error={list.error} />
      ) : (
        <>
          <h2 className="text-lg font-semibold">Waiting for you</h2>
          {waiting.length === 0 ? <EmptyState title="No proof is waiting">New proofs arrive here, and by mail.</EmptyState> : <SentTable rows={waiting} label="Proofs waiting for a decision" press={false} />}
          {earlier.length > 0 ? (
            <>
              <h2 className="text-lg font-semibold">Returned to the desk</h2>
              <SentTable rows={earlier} label="Proofs returned to the desk" press={false} />
            </>
          ) : null}
        </>
      )}
    </Page>
  );
}

/** /press-files (printer): approved and published editions with their press files. */
export function PressFilesPage() {
  const list = useSentEditions();
  const rows = (list.data ?? []).filter((e) => e.hasPressFile);
  return (
    <Page title="Press files" description="Approved editions: the approved proof without the PROOF stamp, ready for the press.">
      {list.isPending ? <Loading /> : list.error ? <ErrorAlert error={list.error} /> : rows.length === 0 ? <EmptyState title="No press files yet" /> : <SentTable rows={rows} label="Press files" press />}
    </Page>
  );
}
