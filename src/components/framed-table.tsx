import type { ReactNode } from 'react';

/**
 * A plain (not sortable, not paged) table in a framed box that scrolls sideways on narrow
 * screens: a caption for screen readers, one header row, the rows as children. An empty
 * heading is an actions column, named for screen readers only. `ruledHead` draws a rule
 * under the header and sets it bold. For sortable, filtered, paged lists use DataTable.
 */
export function FramedTable({ caption, headings, ruledHead = false, children }: { caption: ReactNode; headings: readonly string[]; ruledHead?: boolean; children: ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-surface">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-deep text-left">
          <tr>
            {headings.map((h, i) => (
              <th key={i} scope="col" className={ruledHead ? 'border-b border-rule px-3 py-2 font-semibold' : 'px-3 py-2'}>
                {h || <span className="sr-only">Actions</span>}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
