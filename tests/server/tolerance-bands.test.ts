import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ToleranceBandDto } from '@shared/schemas/tolerance.schema';
import { DEFAULT_BANDS } from '@shared/tolerance';
import { bandService, defaultSetFor } from '@server/services/tolerance-band.service';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { UnitOfWork } from '@server/repositories/unit-of-work';

let server: TestServer;

beforeAll(async () => {
  server = await createTestServer();
});
afterAll(async () => {
  await server.close();
});

async function bands(query = ''): Promise<ToleranceBandDto[]> {
  const res = await server.http.get(`/api/tolerance-bands${query}`).set(await server.bearer('coach'));
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.bands as ToleranceBandDto[];
}

const pick = (list: ToleranceBandDto[], metric: string) => list.find((b) => b.metric === metric)!;

describe('GET /api/tolerance-bands', () => {
  it('has the common-practice set of docs/metrics.md for each age group of the club', async () => {
    const u14 = await bands(`?ageGroupId=${await server.ageGroupId('U14')}`);
    const expected = DEFAULT_BANDS.filter((b) => b.ageGroup === 'U14');
    expect(u14).toHaveLength(expected.length);
    for (const band of expected) {
      expect(pick(u14, band.metric)).toMatchObject({
        ageGroup: 'U14',
        min: band.min,
        max: band.max,
        target: band.target,
        source: 'common practice',
      });
    }
    // docs/metrics.md: level shoulders within ±8°, stance width 0.8–1.3, transition rise at most 0.05.
    expect(pick(u14, 'shoulderTilt')).toMatchObject({ min: -8, max: 8, view: 'front' });
    expect(pick(u14, 'stanceWidthRatio')).toMatchObject({ min: 0.8, max: 1.3, view: 'front' });
    expect(pick(u14, 'transitionRise')).toMatchObject({ min: null, max: 0.05, view: 'front' });
    expect(pick(u14, 'ankleFlexionDifference')).toMatchObject({ min: -5, max: 5, view: 'side' });
  });

  it('gives younger groups the wider back-to-shin band (±10° for U10, ±7° for U16)', async () => {
    const u10 = await bands(`?ageGroupId=${await server.ageGroupId('U10')}`);
    const u16 = await bands(`?ageGroupId=${await server.ageGroupId('U16')}`);
    expect(pick(u10, 'shinTorsoMismatch')).toMatchObject({ min: -10, max: 10 });
    expect(pick(u16, 'shinTorsoMismatch')).toMatchObject({ min: -7, max: 7 });
  });

  it('lists every group’s bands without a filter; an unknown or malformed group is refused', async () => {
    const all = await bands();
    expect(new Set(all.map((b) => b.ageGroup))).toEqual(new Set(['U10', 'U12', 'U14', 'U16']));
    expect(all).toHaveLength(4 * 6);
    const unknown = await server.http
      .get('/api/tolerance-bands?ageGroupId=00000000-0000-4000-8000-000000000000')
      .set(await server.bearer('coach'));
    expect(unknown.status).toBe(404);
    const malformed = await server.http
      .get('/api/tolerance-bands?ageGroupId=U14')
      .set(await server.bearer('coach'));
    expect(malformed.status).toBe(400);
  });
});

describe('seeding the defaults', () => {
  it('is idempotent and fills in only what is missing, leaving an edited band alone', async () => {
    const service = bandService(new UnitOfWork(server.runtime.dataSource), server.clock);
    expect(await service.ensureDefaultsForAllClubs()).toBe(0);
    const u12 = await server.ageGroupId('U12');
    await server.runtime.dataSource.query(
      `DELETE FROM tolerance_band WHERE ageGroupId = ? AND metric = 'stanceWidthRatio'`,
      [u12],
    );
    await server.runtime.dataSource.query(
      `UPDATE tolerance_band SET max = 6, source = 'club' WHERE ageGroupId = ? AND metric = 'shoulderTilt'`,
      [u12],
    );
    expect(await service.ensureDefaultsForAllClubs()).toBe(1);
    const after = await bands(`?ageGroupId=${u12}`);
    expect(pick(after, 'stanceWidthRatio')).toMatchObject({ min: 0.8, max: 1.3, source: 'common practice' });
    expect(pick(after, 'shoulderTilt')).toMatchObject({ max: 6, source: 'club' });
  });

  it('maps a club’s own group names to the nearest default set', () => {
    expect(defaultSetFor({ name: 'U12', maxAge: 11 })).toBe('U12');
    // "Juniors" up to 17 takes the U18 set; adults take Masters.
    expect(defaultSetFor({ name: 'Juniors', maxAge: 17 })).toBe('U18');
    expect(defaultSetFor({ name: 'Adults', maxAge: 80 })).toBe('Masters');
  });
});
