import type { ReactNode } from 'react';
import { SquarewrightMark } from './mark';

/** What a list shows when it has nothing: a title, one line on why, and the next action. */
export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="flex flex-col items-center gap-3 rounded-lg border border-dashed border-rule-strong bg-surface px-6 py-10 text-center">
      <span className="opacity-60">
        <SquarewrightMark size={36} />
      </span>
      <p className="font-semibold text-ink">{title}</p>
      {children ? <div className="max-w-prose text-sm text-ink-muted">{children}</div> : null}
      {action}
    </div>
  );
}
