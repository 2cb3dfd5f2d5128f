import type { LoginResponse } from '@shared/schemas/auth.schema';
import type { ApiErrorBody } from '@shared/schemas/error.schema';

/** Every failed API call surfaces as one of these; components never parse HTTP. */
export class ApiError extends Error {
  override name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export type SessionEvent =
  { type: 'signed-in'; session: LoginResponse } | { type: 'signed-out'; reason: 'signed-out' | 'expired' };

type Query = Record<string, string | number | null | undefined>;

export interface RequestOptions {
  query?: Query;
  body?: unknown;
  signal?: AbortSignal;
  /** 'blob' for downloads (WebVTT, CSV) that must carry the bearer token. */
  responseType?: 'json' | 'blob';
}

export interface UploadOptions {
  signal?: AbortSignal;
  onProgress?: (loaded: number, total: number) => void;
}

// The access token lives in memory only; a reload restores it through the httpOnly refresh cookie.
let accessToken: string | null = null;
let baseUrl = '';
let refreshing: Promise<LoginResponse | null> | null = null;
const listeners = new Set<(event: SessionEvent) => void>();

/** Tests run outside a page and need absolute URLs; the app uses its own origin. */
export function configureApiClient(options: { baseUrl: string }): void {
  baseUrl = options.baseUrl.replace(/\/$/, '');
}

export const authSession = {
  token: (): string | null => accessToken,
  start(session: LoginResponse): void {
    accessToken = session.accessToken;
    listeners.forEach((listener) => listener({ type: 'signed-in', session }));
  },
  end(reason: 'signed-out' | 'expired'): void {
    const hadSession = accessToken !== null || reason === 'signed-out';
    accessToken = null;
    if (hadSession) listeners.forEach((listener) => listener({ type: 'signed-out', reason }));
  },
  subscribe(listener: (event: SessionEvent) => void): () => void {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },
};

function buildUrl(path: string, query?: Query): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  const search = params.toString();
  return `${baseUrl}${path}${search ? `?${search}` : ''}`;
}

function networkError(): ApiError {
  return new ApiError(
    0,
    'network_error',
    'Stanceline cannot be reached. Check your connection and try again.',
  );
}

function fallbackMessage(status: number): string {
  if (status === 413) return 'The file is larger than the server accepts.';
  if (status === 429) return 'Too many attempts. Wait a minute and try again.';
  if (status >= 500) return 'Stanceline had a problem on its side. Try again in a moment.';
  return `The request failed (HTTP ${status}).`;
}

export function errorFromBody(status: number, text: string): ApiError {
  try {
    const body = JSON.parse(text) as Partial<ApiErrorBody>;
    if (body.error && typeof body.error.message === 'string') {
      return new ApiError(
        status,
        body.error.code ?? `http_${status}`,
        body.error.message,
        body.error.details,
      );
    }
  } catch {
    // Not JSON (a proxy page, an empty body): fall through to a plain message.
  }
  return new ApiError(status, `http_${status}`, fallbackMessage(status));
}

/**
 * Exchanges the refresh cookie for a new access token. Concurrent callers share one request, so a burst
 * of expired calls refreshes once. Resolves null when there is no valid cookie.
 */
export function refreshSession(): Promise<LoginResponse | null> {
  refreshing ??= (async () => {
    try {
      let res: Response;
      try {
        res = await fetch(buildUrl('/api/auth/refresh'), {
          method: 'POST',
          credentials: 'same-origin',
          headers: { Accept: 'application/json' },
        });
      } catch {
        throw networkError();
      }
      if (res.status === 401 || res.status === 403) return null;
      if (!res.ok) throw errorFromBody(res.status, await res.text());
      const session = (await res.json()) as LoginResponse;
      authSession.start(session);
      return session;
    } finally {
      refreshing = null;
    }
  })();
  return refreshing;
}

/** Decides what a 401 means: refresh once and retry, or end the session. */
async function shouldRetryAfter(error: ApiError, hadToken: boolean, retried: boolean): Promise<boolean> {
  if (error.status !== 401 || !hadToken) return false;
  if (error.code === 'token_expired' && !retried) {
    const renewed = await refreshSession().catch(() => null);
    if (renewed) return true;
  }
  authSession.end('expired');
  return false;
}

async function request<T>(
  method: string,
  path: string,
  options: RequestOptions = {},
  retried = false,
): Promise<T> {
  const headers = new Headers({ Accept: 'application/json' });
  const token = accessToken;
  if (token) headers.set('Authorization', `Bearer ${token}`);
  let body: BodyInit | undefined;
  if (options.body !== undefined) {
    headers.set('Content-Type', 'application/json');
    body = JSON.stringify(options.body);
  }
  let res: Response;
  try {
    res = await fetch(buildUrl(path, options.query), {
      method,
      headers,
      body,
      signal: options.signal,
      credentials: 'same-origin',
    });
  } catch (err) {
    if (options.signal?.aborted) throw err;
    throw networkError();
  }
  if (res.ok && options.responseType === 'blob') return (await res.blob()) as T;
  const text = await res.text();
  if (res.ok) return (text ? JSON.parse(text) : undefined) as T;
  const error = errorFromBody(res.status, text);
  if (await shouldRetryAfter(error, token !== null, retried)) return request<T>(method, path, options, true);
  throw error;
}

function sendForm<T>(path: string, form: FormData, options: UploadOptions): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', buildUrl(path));
    xhr.setRequestHeader('Accept', 'application/json');
    if (accessToken) xhr.setRequestHeader('Authorization', `Bearer ${accessToken}`);
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) options.onProgress?.(event.loaded, event.total);
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        try {
          resolve((xhr.responseText ? JSON.parse(xhr.responseText) : undefined) as T);
        } catch {
          reject(
            new ApiError(xhr.status, 'bad_response', 'The server sent an answer Stanceline cannot read.'),
          );
        }
      } else {
        reject(errorFromBody(xhr.status, xhr.responseText));
      }
    };
    xhr.onerror = () => reject(networkError());
    xhr.onabort = () => reject(new DOMException('Upload cancelled', 'AbortError'));
    if (options.signal?.aborted) {
      reject(new DOMException('Upload cancelled', 'AbortError'));
      return;
    }
    options.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}

/** Multipart POST through XMLHttpRequest, because fetch cannot report upload progress. */
async function upload<T>(
  path: string,
  form: FormData,
  options: UploadOptions = {},
  retried = false,
): Promise<T> {
  const hadToken = accessToken !== null;
  try {
    return await sendForm<T>(path, form, options);
  } catch (err) {
    if (err instanceof ApiError && (await shouldRetryAfter(err, hadToken, retried))) {
      return upload<T>(path, form, options, true);
    }
    throw err;
  }
}

export const api = {
  get: <T>(path: string, options?: RequestOptions) => request<T>('GET', path, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) =>
    request<T>('POST', path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options?: RequestOptions) =>
    request<T>('PATCH', path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options?: RequestOptions) =>
    request<T>('PUT', path, { ...options, body }),
  delete: <T>(path: string, options?: RequestOptions) => request<T>('DELETE', path, options),
  getBlob: (path: string, options?: RequestOptions) =>
    request<Blob>('GET', path, { ...options, responseType: 'blob' }),
  upload,
};

export function errorMessage(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Try again.';
}
