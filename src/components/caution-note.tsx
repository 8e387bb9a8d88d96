import type { ReactNode } from 'react';

/** A quiet, bordered caution beside an irreversible step. Use PrintCaution / TaxCaution for the standard texts. */
export function CautionNote({ title, children }: { title: string; children: ReactNode }) {
  return (
    <aside aria-label={title} className="rounded-md border border-warning/40 border-l-4 border-l-warning bg-warning-soft px-3 py-2 text-sm text-ink">
      <p className="font-semibold">{title}</p>
      <div className="text-ink-soft">{children}</div>
    </aside>
  );
}

/** The standard caution before anything goes to press. */
export function PrintCaution() {
  return (
    <CautionNote title="Check the proof before press">
      Squarewright checks fonts, page size, bleed and legibility, but it cannot see everything. Read every page of the
      proof, including the solutions, on paper if you can, before you approve it for the press run.
    </CautionNote>
  );
}

/** The standard caution beside fees and payouts. */
export function TaxCaution() {
  return (
    <CautionNote title="Tax and payment rules">
      Payouts are subject to local tax rules. Squarewright records fees and payments; it does not withhold tax or give
      tax advice. Check what applies to each setter with your finance team.
    </CautionNote>
  );
}
