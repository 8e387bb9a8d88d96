import type { ReactNode } from 'react';
import { SquarewrightMark } from '../../../components/mark';
import { useDocumentTitle } from '../../../components/page';

/** The quiet frame of the signed-out pages: mark, name, one card, an optional aside. */
export function AuthFrame({ title, children, aside }: { title: string; children: ReactNode; aside?: ReactNode }) {
  useDocumentTitle(title);
  return (
    <div className="flex min-h-dvh flex-col items-center bg-paper px-4 py-12">
      <div className="flex w-full max-w-md flex-col gap-6">
        <div className="flex items-center gap-3">
          <SquarewrightMark size={40} />
          <div>
            <p className="text-xl font-semibold tracking-tight text-ink">Squarewright</p>
            <p className="font-serif text-sm text-ink-muted italic">Squared rectangles, checked and set for print</p>
          </div>
        </div>
        <main className="rounded-lg border border-rule bg-surface p-6 shadow-[0_1px_0_rgba(31,35,40,0.05)]">
          <h1 className="mb-4 text-xl font-semibold text-ink">{title}</h1>
          {children}
        </main>
        {aside}
      </div>
    </div>
  );
}
