import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { ApiError } from '@/lib/api-client.ts';
import { Notice } from '@/components/ui/notice.tsx';

/** Error boundary for a route: says what went wrong and what to do next. */
export function RouteError() {
  const error = useRouteError();
  let title = 'This page could not be shown.';
  let detail = 'Reload the page. If it keeps happening, tell your administrator what you were doing.';
  if (error instanceof ApiError) {
    title = error.status === 403 ? 'Your role cannot open this page.' : error.status === 404 ? 'That was not found.' : title;
    detail = `${error.message}${error.requestId ? ` (request ${error.requestId})` : ''}`;
  } else if (isRouteErrorResponse(error)) {
    title = `${error.status} ${error.statusText}`;
  } else if (error instanceof Error && /dynamically imported module|Failed to fetch/i.test(error.message)) {
    title = 'Stackyard was updated or the connection dropped.';
    detail = 'Reload the page to get the latest version.';
  }
  return (
    <div className="mx-auto max-w-xl p-8">
      <Notice tone="danger" title={title}>
        <p>{detail}</p>
        <p className="mt-2">
          <Link className="underline" to="/">
            Back to home
          </Link>
        </p>
      </Notice>
    </div>
  );
}
