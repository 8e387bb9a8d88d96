import { Page } from '../components/page';
import { EmptyState } from '../components/empty-state';

/** Placeholder for a page whose feature has not landed yet (an entry in routes.tsx without `page`). */
export function ComingSoonPage({ title, summary }: { title: string; summary?: string | undefined }) {
  return (
    <Page title={title} description={summary}>
      <EmptyState title="Coming soon">
        The {title} page is not built yet. It will appear here when its feature lands; nothing is lost in the meantime.
      </EmptyState>
    </Page>
  );
}
