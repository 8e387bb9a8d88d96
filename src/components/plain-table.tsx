import type { ReactNode } from 'react';

/** A column heading; `numeric` right-aligns it over its figures. An empty label is an actions column. */
export type TableHeading = string | { label: string; numeric: true };

export interface PlainTableProps {
  /** For screen readers (visually hidden). */
  caption: ReactNode;
  headings: readonly TableHeading[];
  /** Tighter header cells (px-2 py-1), for a drawer or a history inside a card. */
  dense?: boolean;
  /** A rule under each heading (default on). */
  ruledHead?: boolean;
  /** The header row on the deeper paper colour. */
  shadedHead?: boolean;
  /** Headings set semibold. */
  boldHead?: boolean;
  /** Rows for a `<tfoot>` (totals). */
  footer?: ReactNode;
  /** The body rows. */
  children: ReactNode;
}

/**
 * A plain (not sortable, not paged) table: a caption for screen readers, one header row, the
 * rows as children. FramedTable puts one in a framed box; for sortable, filtered, paged lists
 * use DataTable.
 */
export function PlainTable({ caption, headings, dense = false, ruledHead = true, shadedHead = false, boldHead = false, footer, children }: PlainTableProps) {
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="sr-only">{caption}</caption>
      <thead className={shadedHead ? 'bg-paper-deep text-left' : 'text-left'}>
        <tr>
          {headings.map((h, i) => {
            const label = typeof h === 'string' ? h : h.label;
            const classes = [ruledHead && 'border-b border-rule', dense ? 'px-2 py-1' : 'px-3 py-2', boldHead && 'font-semibold', typeof h !== 'string' && 'text-right'];
            return (
              <th key={i} scope="col" className={classes.filter(Boolean).join(' ')}>
                {label || <span className="sr-only">Actions</span>}
              </th>
            );
          })}
        </tr>
      </thead>
      <tbody>{children}</tbody>
      {footer ? <tfoot>{footer}</tfoot> : null}
    </table>
  );
}
