import { Link, useParams } from 'react-router-dom';
import { ErrorAlert } from '../../../components/alert';
import { Card, Loading, Page } from '../../../components/page';
import { formatDateTime } from '../../../lib/format';
import { useMail } from '../api/get-mail';
import { LinkifiedText } from './linkified-text';

/** /admin/mailbox/:id: one caught mail, its links clickable. */
export function MailPage() {
  const { id = '' } = useParams();
  const mail = useMail(id);
  return (
    <Page title={mail.data?.subject || 'Mail'} actions={<Link to="/admin/mailbox">← All caught mail</Link>}>
      {mail.isPending ? (
        <Loading />
      ) : mail.error ? (
        <ErrorAlert error={mail.error} title="Could not open this mail" />
      ) : (
        <Card>
          <dl className="grid grid-cols-[6rem_1fr] gap-x-3 gap-y-1 border-b border-rule pb-3 text-sm">
            <dt className="text-ink-muted">From</dt>
            <dd>{mail.data.from}</dd>
            <dt className="text-ink-muted">To</dt>
            <dd><code>{mail.data.to}</code></dd>
            <dt className="text-ink-muted">Received</dt>
            <dd className="tabular-nums">{formatDateTime(mail.data.receivedAt)}</dd>
          </dl>
          <LinkifiedText text={mail.data.text} />
        </Card>
      )}
    </Page>
  );
}
