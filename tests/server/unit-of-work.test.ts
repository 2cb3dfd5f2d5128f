import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { UnitOfWork } from '@server/repositories/unit-of-work';
import { createTestServer, type TestServer } from '../helpers/server-harness';

// Two requests' transactions at once on the one SQLite connection: each must stand or fall alone.
let server: TestServer;

beforeAll(async () => {
  server = await createTestServer();
});
afterAll(async () => {
  await server.close();
});

const hits = async (key: string) =>
  (
    (await server.runtime.dataSource.query('SELECT COUNT(*) AS n FROM rate_limit_hit WHERE key = ?', [
      key,
    ])) as {
      n: number;
    }[]
  )[0].n;

describe('transactions on one connection', () => {
  it('keep a committed transaction when another that overlapped it rolls back', async () => {
    const uow = new UnitOfWork(server.runtime.dataSource);
    const failing = uow.transaction(async (manager) => {
      await uow.of(manager).rateLimits.hit('tx-failing', new Date(), 60_000);
      await new Promise((r) => setTimeout(r, 50));
      throw new Error('this request fails');
    });
    const committing = uow.transaction(async (manager) => {
      await uow.of(manager).rateLimits.hit('tx-committing', new Date(), 60_000);
    });
    await expect(failing).rejects.toThrow('this request fails');
    await committing;
    expect(await hits('tx-failing')).toBe(0);
    expect(await hits('tx-committing')).toBe(1);
  });

  it('lets a transaction started inside another join it', async () => {
    const uow = new UnitOfWork(server.runtime.dataSource);
    await uow.transaction(async (manager) => {
      await uow.of(manager).rateLimits.hit('tx-outer', new Date(), 60_000);
      await uow.transaction(async (inner) => {
        await uow.of(inner).rateLimits.hit('tx-inner', new Date(), 60_000);
      });
    });
    expect(await hits('tx-outer')).toBe(1);
    expect(await hits('tx-inner')).toBe(1);
  });
});
