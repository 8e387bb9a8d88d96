import { Link } from 'react-router-dom';
import { ErrorAlert } from '../../../components/alert';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Loading, Page } from '../../../components/page';
import { formatDateTime } from '../../../lib/format';
import { useMailList } from '../api/list-mail';

/** /admin/mailbox: what the local fake mail server caught (development, demo and tests only). */
export function MailboxPage() {
  const mail = useMailList();
  return (
    <Page
      title="Mailbox (local)"
      description="Mail caught by the local fake mail server that runs when no SMTP server is configured. Nothing here left this machine."
    >
      {mail.isPending ? (
        <Loading />
      ) : mail.error ? (
        <ErrorAlert error={mail.error} title="Could not read the mailbox" />
      ) : mail.data.length === 0 ? (
        <EmptyState title="No mail caught yet">Invitations, password resets and proof notices appear here as they are sent.</EmptyState>
      ) : (
        <FramedTable caption="Caught mail" headings={['Subject', 'To', 'From', 'Received']} ruledHead>
          {mail.data.map((m) => (
            <tr key={m.id} className="border-b border-rule last:border-b-0">
              <td className="px-3 py-2">
                <Link to={`/admin/mailbox/${m.id}`}>{m.subject || '(no subject)'}</Link>
              </td>
              <td className="px-3 py-2"><code className="text-ink-soft">{m.to}</code></td>
              <td className="px-3 py-2 text-ink-muted">{m.from}</td>
              <td className="px-3 py-2 tabular-nums whitespace-nowrap text-ink-muted">{formatDateTime(m.receivedAt)}</td>
            </tr>
          ))}
        </FramedTable>
      )}
    </Page>
  );
}
