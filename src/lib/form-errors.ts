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
