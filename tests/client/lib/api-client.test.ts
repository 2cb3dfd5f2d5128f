import { http, HttpResponse } from 'msw';
import { setupServer } from 'msw/node';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { LoginResponse } from '@shared/schemas/auth.schema';
import { api, ApiError, authSession, configureApiClient, type SessionEvent } from '@/lib/api-client';

const BASE = 'http://stanceline.test';
const user: LoginResponse['user'] = {
  id: '00000000-0000-4000-8000-000000000001',
  email: 'coach@larchwood.example',
  name: 'Test Coach',
  role: 'coach',
  clubId: '00000000-0000-4000-8000-0000000000c1',
  athleteId: null,
  childAthleteIds: [],
  coachedAgeGroupIds: [],
};

const server = setupServer();
let refreshCalls = 0;
let events: SessionEvent[] = [];
let unsubscribe: () => void = () => {};

beforeAll(() => {
  configureApiClient({ baseUrl: BASE });
  server.listen({ onUnhandledRequest: 'error' });
});
afterEach(() => {
  server.resetHandlers();
  authSession.end('signed-out');
  unsubscribe();
  refreshCalls = 0;
  events = [];
});
afterAll(() => server.close());

function track() {
  unsubscribe = authSession.subscribe((event) => events.push(event));
}

/** An API that accepts only "fresh" and answers "stale" with the server's token_expired error. */
function expiringApi(refreshWorks: boolean) {
  server.use(
    http.post(`${BASE}/api/auth/refresh`, () => {
      refreshCalls += 1;
      return refreshWorks
        ? HttpResponse.json({ accessToken: 'fresh', user })
        : HttpResponse.json({ error: { code: 'unauthorized', message: 'Sign in again' } }, { status: 401 });
    }),
    http.get(`${BASE}/api/sessions`, ({ request }) =>
      request.headers.get('authorization') === 'Bearer fresh'
        ? HttpResponse.json({ sessions: [] })
        : HttpResponse.json({ error: { code: 'token_expired', message: 'expired' } }, { status: 401 }),
    ),
  );
}

describe('api client', () => {
  it('turns the error body into a typed ApiError', async () => {
    server.use(
      http.post(`${BASE}/api/athletes`, () =>
        HttpResponse.json(
          {
            error: { code: 'consent_missing', message: 'Record consent first', details: { athleteId: 'a' } },
          },
          { status: 409 },
        ),
      ),
    );
    const error = await api.post('/api/athletes', {}).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 409,
      code: 'consent_missing',
      message: 'Record consent first',
      details: { athleteId: 'a' },
    });
  });

  it('gives a plain message when the body is not the API error shape', async () => {
    server.use(
      http.get(`${BASE}/api/me`, () => new HttpResponse('<html>Bad gateway</html>', { status: 502 })),
    );
    const error = await api.get('/api/me').catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 502, code: 'http_502' });
    expect((error as ApiError).message).toMatch(/problem on its side/);
  });

  it('sends query parameters and leaves out empty ones', async () => {
    let seen = '';
    server.use(
      http.get(`${BASE}/api/athletes`, ({ request }) => {
        seen = new URL(request.url).search;
        return HttpResponse.json({ athletes: [] });
      }),
    );
    await api.get('/api/athletes', { query: { search: 'Elsie M', ageGroupId: '', other: undefined } });
    expect(seen).toBe('?search=Elsie+M');
  });

  it('refreshes once on token_expired and retries with the new token', async () => {
    expiringApi(true);
    authSession.start({ accessToken: 'stale', user });
    track();
    const results = await Promise.all([
      api.get('/api/sessions'),
      api.get('/api/sessions'),
      api.get('/api/sessions'),
    ]);
    expect(results).toEqual([{ sessions: [] }, { sessions: [] }, { sessions: [] }]);
    // Three requests expired together; they share one refresh.
    expect(refreshCalls).toBe(1);
    expect(authSession.token()).toBe('fresh');
    expect(events.map((e) => e.type)).toEqual(['signed-in']);
  });

  it('ends the session as expired when the refresh fails', async () => {
    expiringApi(false);
    authSession.start({ accessToken: 'stale', user });
    track();
    const error = await api.get('/api/sessions').catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 401, code: 'token_expired' });
    expect(refreshCalls).toBe(1);
    expect(authSession.token()).toBeNull();
    expect(events).toEqual([{ type: 'signed-out', reason: 'expired' }]);
  });

  it('does not try to refresh when a sign-in without a token is refused', async () => {
    server.use(
      http.post(`${BASE}/api/auth/refresh`, () => {
        refreshCalls += 1;
        return HttpResponse.json({ accessToken: 'x', user });
      }),
      http.post(`${BASE}/api/auth/login`, () =>
        HttpResponse.json(
          { error: { code: 'invalid_credentials', message: 'Wrong email or password' } },
          { status: 401 },
        ),
      ),
    );
    track();
    const error = await api
      .post('/api/auth/login', { email: 'a@b.c', password: 'x' })
      .catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 401, message: 'Wrong email or password' });
    expect(refreshCalls).toBe(0);
    expect(events).toEqual([]);
  });

  it('reports an unreachable server as a network error', async () => {
    server.use(http.get(`${BASE}/api/me`, () => HttpResponse.error()));
    const error = await api.get('/api/me').catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 0, code: 'network_error' });
  });
});
