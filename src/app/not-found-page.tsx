import { ButtonLink } from '../components/button';
import { SquarewrightMark } from '../components/mark';

/** 404: no page at this address (inside or outside the signed-in app). */
export function NotFoundPage() {
  return (
    <div className="mx-auto flex max-w-lg flex-col items-start gap-4 py-16">
      <SquarewrightMark size={44} />
      <h1 className="text-2xl font-semibold">Page not found</h1>
      <p className="text-ink-muted">
        There is no page at <code className="rounded bg-paper-deep px-1">{typeof window === 'undefined' ? '' : window.location.pathname}</code>. The
        link may be old, or the address mistyped.
      </p>
      <ButtonLink to="/" variant="primary">
        Go to the home page
      </ButtonLink>
    </div>
  );
}
