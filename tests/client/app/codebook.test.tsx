// @vitest-environment happy-dom
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { codebook } from '@shared/exports/codebook';
import type { CodebookResponse } from '@shared/schemas/export.schema';
import { userWith } from '../helpers/demo-data';
import { createApiMock, ORIGIN, renderApp, resetSession } from '../helpers/render-app';

const api = createApiMock();

beforeAll(() => api.listen({ onUnhandledRequest: 'error' }));
afterEach(() => {
  cleanup();
  api.resetHandlers();
  resetSession();
});
afterAll(() => api.close());

describe('codebook page', () => {
  it('lets an athlete look up every column of an export file', async () => {
    const user = userWith('athlete', { athleteId: '40000000-0000-4000-8000-000000000001' });
    const book: CodebookResponse = {
      columns: codebook(),
      smoothing: 'values=smoothed: Butterworth 6 Hz',
      numbers: 'Decimal point',
    };
    api.use(
      http.post(`${ORIGIN}/api/auth/refresh`, () => HttpResponse.json({ accessToken: 't', user })),
      http.get(`${ORIGIN}/api/me`, () =>
        HttpResponse.json({ user, club: { id: user.clubId, name: 'Test Club' } }),
      ),
      http.get(`${ORIGIN}/api/exports/codebook`, () => HttpResponse.json(book)),
    );
    const person = userEvent.setup();
    renderApp('/exports/codebook');
    const table = await screen.findByRole('table', { name: 'Codebook of the frames export' });
    const knee = within(table).getByRole('rowheader', { name: 'kneeFlexionLeft_deg' }).closest('tr')!;
    expect(knee.textContent).toContain('unit: degrees');
    expect(knee.textContent).toContain('sign: 0 = straight leg, + = bent');
    await person.click(screen.getByRole('tab', { name: 'turns.csv' }));
    const turns = await screen.findByRole('table', { name: 'Codebook of the turns export' });
    expect(within(turns).getByRole('rowheader', { name: 'transition_rise_ratio' })).toBeTruthy();
  });
});
