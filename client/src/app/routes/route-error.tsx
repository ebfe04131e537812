import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { ErrorState } from '../../components/query-states';
import { paths } from '../../config/paths';
import { isApiError } from '../../lib/api-client';

/** Statuses that have a plain explanation; anything else shows the error's own message. */
const KNOWN: Record<number, { title: string; detail: string }> = {
  403: { title: 'Your role cannot open this page', detail: 'Ask a lab manager if your work needs it.' },
  404: { title: 'Nothing here', detail: 'The address may be mistyped, or the item was deleted.' },
};

function statusOf(error: unknown): number | null {
  if (isRouteErrorResponse(error)) return error.status;
  if (isApiError(error)) return error.status;
  return null;
}

/** What a page shows when its data could not be loaded or it does not exist. */
export function RouteError() {
  const error = useRouteError();
  const status = statusOf(error);
  const known = status !== null ? KNOWN[status] : undefined;
  const detail = isRouteErrorResponse(error) ? new Error(String(error.data ?? error.statusText)) : error;
  return (
    <div className="mx-auto max-w-3xl p-4">
      {known ? (
        <ErrorState title={known.title} error={new Error(known.detail)} />
      ) : (
        <ErrorState title="This page could not be loaded" error={detail} onRetry={() => window.location.reload()} />
      )}
      <Link to={paths.home.href()} className="inline-flex min-h-touch items-center font-semibold">
        Go to the home page
      </Link>
    </div>
  );
}

export function NotFoundRoute() {
  return (
    <div className="mx-auto max-w-3xl p-4">
      <h1 className="text-2xl font-bold">Nothing here</h1>
      <p className="mt-2">This address does not lead to a page.</p>
      <Link to={paths.home.href()} className="inline-flex min-h-touch items-center font-semibold">
        Go to the home page
      </Link>
    </div>
  );
}
