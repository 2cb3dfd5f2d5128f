import { ApiError, errorMessage } from '@/lib/api-client';
import { Button } from './button';
import { Notice } from './notice';

function advice(error: unknown): string | null {
  if (!(error instanceof ApiError)) return null;
  if (error.status === 404) return 'It may have been removed, or it is outside what your role can see.';
  if (error.status === 403) return 'Your role does not allow this. Ask your head coach if you need access.';
  if (error.status === 0 || error.status >= 500)
    return 'Try again; if it keeps failing, tell your club admin.';
  return null;
}

export function QueryError({ error, retry, what }: { error: unknown; retry?: () => void; what: string }) {
  const hint = advice(error);
  return (
    <Notice tone="error" title={`Could not load ${what}`}>
      <p>{errorMessage(error)}</p>
      {hint ? <p className="mt-1 text-granite-600">{hint}</p> : null}
      {retry ? (
        <Button variant="secondary" size="sm" className="mt-3" onClick={retry}>
          Try again
        </Button>
      ) : null}
    </Notice>
  );
}
