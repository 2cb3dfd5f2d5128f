import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import supertest from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import type { LoginResponse } from '@shared/schemas/auth.schema';
import { createApp, type AppDeps } from '@server/app';
import { loadConfig, type Config } from '@server/config';
import { createLogger } from '@server/logger';
import { startRuntime, type Runtime } from '@server/runtime';
import { seedDemoClub } from '@server/seed/demo-seed';
import { DEMO_PASSWORD } from '@server/seed/demo-club';
import type { Clock } from '@server/services/principal';

/** A clock tests can move: `offsetMs` shifts "now" for token issue times and expiry checks. */
export class TestClock implements Clock {
  offsetMs = 0;
  now(): Date {
    return new Date(Date.now() + this.offsetMs);
  }
}

export type DemoRole = 'head' | 'coach' | 'analyst' | 'athlete' | 'guardian';
export const DEMO_EMAILS: Record<DemoRole, string> = {
  head: 'head@larchwood.example',
  coach: 'coach@larchwood.example',
  analyst: 'analyst@larchwood.example',
  athlete: 'athlete@larchwood.example',
  guardian: 'guardian@larchwood.example',
};

export interface TestServer {
  app: Express;
  http: TestAgent;
  config: Config;
  runtime: Runtime;
  clock: TestClock;
  dataDir: string;
  /** Another app on the same database and stand-ins, with some dependencies swapped (failure tests). */
  buildApp(overrides: Partial<AppDeps>): Express;
  login(role: DemoRole): Promise<LoginResponse & { cookie: string }>;
  /** Bearer header for a demo role, signing in once and reusing the token. */
  bearer(role: DemoRole): Promise<{ Authorization: string }>;
  athleteId(firstName: string): Promise<string>;
  ageGroupId(name: string): Promise<string>;
  sessionIds(): Promise<string[]>;
  count(table: string): Promise<number>;
  tempFiles(): Promise<string[]>;
  close(): Promise<void>;
}

/**
 * The real app on a temporary SQLite file, an embedded s3rver and SMTP fake on random loopback
 * ports, with the demo club seeded. bcrypt runs at cost 4 to keep the suite fast.
 */
export async function createTestServer(env: Record<string, string> = {}): Promise<TestServer> {
  const dataDir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-api-'));
  const config = loadConfig({
    DATA_DIR: dataDir,
    LOG_LEVEL: 'silent',
    BCRYPT_ROUNDS: '4',
    LOGIN_RATE_LIMIT: '1000',
    PUBLIC_URL: 'http://stanceline.test',
    // As npm start runs it: the embedded SMTP fake's inbox on.
    DEV_MAILBOX: 'on',
    // No pose analysis on the server unless a test asks for it: it would load a core in every suite.
    ANALYSIS_WORKERS: '0',
    AUTO_ANALYSIS: 'off',
    ...env,
  });
  const runtime = await startRuntime(config);
  const clock = new TestClock();
  await seedDemoClub(runtime.dataSource, { bcryptRounds: config.bcryptRounds, clock });
  const deps: AppDeps = {
    config,
    dataSource: runtime.dataSource,
    storage: runtime.storage,
    mediaQueue: runtime.mediaQueue,
    jobs: runtime.jobs,
    analyses: runtime.analyses,
    mailer: runtime.mailer,
    mailbox: runtime.mailbox,
    jwtSecret: runtime.jwtSecret,
    publicUrl: config.publicUrl!,
    logger: createLogger('silent'),
    clock,
  };
  const app = createApp(deps);
  const http = supertest(app);
  const tokens = new Map<DemoRole, string>();

  const login = async (role: DemoRole) => {
    const res = await http
      .post('/api/auth/login')
      .send({ email: DEMO_EMAILS[role], password: DEMO_PASSWORD });
    if (res.status !== 200) throw new Error(`login ${role}: ${res.status} ${JSON.stringify(res.body)}`);
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? [])[0]?.split(';')[0] ?? '';
    return { ...(res.body as LoginResponse), cookie };
  };

  const one = async <T>(sql: string, params: unknown[]): Promise<T> => {
    const rows = (await runtime.dataSource.query(sql, params)) as T[];
    if (rows.length !== 1) throw new Error(`expected one row for ${sql} ${JSON.stringify(params)}`);
    return rows[0];
  };

  return {
    app,
    http,
    config,
    runtime,
    clock,
    dataDir,
    buildApp: (overrides) => createApp({ ...deps, ...overrides }),
    login,
    async bearer(role) {
      if (!tokens.has(role)) tokens.set(role, (await login(role)).accessToken);
      return { Authorization: `Bearer ${tokens.get(role)}` };
    },
    async athleteId(firstName) {
      return (await one<{ id: string }>('SELECT id FROM athlete WHERE firstName = ?', [firstName])).id;
    },
    async ageGroupId(name) {
      return (await one<{ id: string }>('SELECT id FROM age_group WHERE name = ?', [name])).id;
    },
    async sessionIds() {
      const rows = (await runtime.dataSource.query('SELECT id FROM training_session ORDER BY date ASC')) as {
        id: string;
      }[];
      return rows.map((r) => r.id);
    },
    async count(table) {
      return (await one<{ n: number }>(`SELECT COUNT(*) AS n FROM "${table}"`, [])).n;
    },
    async tempFiles() {
      return fs.readdir(config.uploadTempDir).catch(() => []);
    },
    async close() {
      await runtime.close();
      await fs.rm(dataDir, { recursive: true, force: true });
    },
  };
}
