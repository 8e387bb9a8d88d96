import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { Alert } from '../components/alert';
import { buttonClasses } from '../components/button';
import { ApiError } from '../lib/api-client';
import { NotFoundPage } from './not-found-page';

/** The router's error boundary: 404s get the not-found page, anything else a calm message and a reload button. */
export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFoundPage />;
  if (error instanceof ApiError && error.status === 404) return <NotFoundPage />;
  const message =
    error instanceof ApiError
      ? error.message
      : isRouteErrorResponse(error)
        ? `${error.status} ${error.statusText}`
        : error instanceof Error
          ? error.message
          : 'Unknown error';
  return (
    <div className="mx-auto flex max-w-xl flex-col gap-4 px-6 py-16">
      <h1 className="text-2xl font-semibold">Something went wrong</h1>
      <Alert tone="danger" title="This page could not be shown">
        {message}
      </Alert>
      <p className="text-ink-muted">Nothing you saved is lost. Reload the page, or go back to the home page.</p>
      <div className="flex gap-2">
        <button type="button" className={buttonClasses('primary')} onClick={() => window.location.reload()}>
          Reload
        </button>
        <a href="/" className={buttonClasses('secondary')}>
          Home
        </a>
      </div>
    </div>
  );
}
