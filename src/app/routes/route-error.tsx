import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

/** Last resort for a page that crashed or whose code failed to load (e.g. after a new release). */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Unknown error';
  return (
    <div className="mx-auto max-w-lg px-4 py-16">
      <Notice tone="error" title="This page failed to open">
        <p>{message}</p>
        <p className="mt-1 text-granite-600">Reload the page; if it keeps failing, tell your club admin.</p>
        <Button variant="secondary" size="sm" className="mt-3" onClick={() => window.location.reload()}>
          Reload
        </Button>
      </Notice>
    </div>
  );
}
