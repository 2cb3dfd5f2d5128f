import { ApiError } from './api-client';

/**
 * The per-field problems a 400 answer names (`details.issues[].path`), so a form can show each beside
 * its field; anything else stays a message for the whole form.
 */
export function fieldIssues(error: unknown): { field: string; message: string }[] {
  if (!(error instanceof ApiError) || error.status !== 400) return [];
  const issues = (error.details as { issues?: { path?: unknown[]; message?: string }[] } | undefined)?.issues;
  return (issues ?? [])
    .filter((i) => typeof i.path?.[0] === 'string' && typeof i.message === 'string')
    .map((i) => ({ field: i.path![0] as string, message: i.message! }));
}

/**
 * Shows each problem the server named beside its field (react-hook-form's setError), for the fields
 * the form has; anything else is left to the form's general message.
 */
export function placeFieldIssues<F extends string>(
  error: unknown,
  fields: readonly F[],
  setError: (field: F, error: { message: string }) => void,
): void {
  for (const issue of fieldIssues(error)) {
    if ((fields as readonly string[]).includes(issue.field))
      setError(issue.field as F, { message: issue.message });
  }
}
