/** The one error shape every API route returns. */
export interface ApiErrorBody {
  error: { code: string; message: string; details?: unknown };
}
