import type { ReactNode } from 'react';
import { PlainTable, type TableHeading } from './plain-table';

/**
 * A plain (not sortable, not paged) table in a framed box that scrolls sideways on narrow
 * screens: a caption for screen readers, one header row, the rows as children. An empty
 * heading is an actions column, named for screen readers only. `ruledHead` draws a rule
 * under the header and sets it bold. For sortable, filtered, paged lists use DataTable.
 */
export function FramedTable({ caption, headings, ruledHead = false, children }: { caption: ReactNode; headings: readonly TableHeading[]; ruledHead?: boolean; children: ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-surface">
      <PlainTable caption={caption} headings={headings} ruledHead={ruledHead} boldHead={ruledHead} shadedHead>
        {children}
      </PlainTable>
    </div>
  );
}
