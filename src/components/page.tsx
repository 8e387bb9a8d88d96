import { useEffect, type ReactNode } from 'react';
import { PanelBoundary } from './panel-boundary';

/** Names the browser tab after the page: "Stock · Squarewright". */
export function useDocumentTitle(title: string) {
  useEffect(() => {
    document.title = `${title} · Squarewright`;
  }, [title]);
}

/**
 * The frame of one page: an h1 title, optional one-line description, actions on the
 * right, then the content. Also sets the document title.
 */
export function Page({ title, description, actions, children }: { title: string; description?: ReactNode; actions?: ReactNode; children?: ReactNode }) {
  useDocumentTitle(title);
  return (
    <div className="flex flex-col gap-6">
      <header className="flex flex-wrap items-end justify-between gap-4 border-b border-rule pb-4">
        <div className="flex flex-col gap-1">
          <h1 className="text-2xl font-semibold tracking-tight text-ink">{title}</h1>
          {description ? <p className="max-w-prose text-ink-muted">{description}</p> : null}
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </header>
      {children}
    </div>
  );
}

/** A white card with an optional heading, for grouping content on a page; an error boundary of its own (PanelBoundary). */
export function Card({ title, children, footer, className = '' }: { title?: ReactNode; children?: ReactNode; footer?: ReactNode; className?: string }) {
  return (
    <section className={`flex flex-col gap-3 rounded-lg border border-rule bg-surface p-5 shadow-[0_1px_0_rgba(31,35,40,0.04)] ${className}`}>
      {title ? <h2 className="text-base font-semibold text-ink">{title}</h2> : null}
      {/* each card is a panel: what fails to draw inside it stays inside it */}
      <PanelBoundary label={title}>
        {children}
        {footer ? <div className="mt-auto pt-2">{footer}</div> : null}
      </PanelBoundary>
    </section>
  );
}

/** A centred, accessible loading line. */
export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-2 p-6 text-ink-muted">
      <span className="size-4 animate-spin rounded-full border-2 border-rule-strong border-r-transparent" aria-hidden />
      {label}
    </div>
  );
}
