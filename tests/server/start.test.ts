import fs from 'node:fs/promises';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_SIGN_INS } from '@server/seed/demo-club';
import { startStanceline, type StartedStanceline } from '@server/start';

let dataDir: string;
let app: StartedStanceline;

beforeAll(async () => {
  dataDir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-start-'));
  app = await startStanceline({ port: 0, dataDir, logLevel: 'silent', env: { BCRYPT_ROUNDS: '4' } });
});
afterAll(async () => {
  await app.close();
  await fs.rm(dataDir, { recursive: true, force: true });
});

async function json(url: string, init?: RequestInit) {
  const res = await fetch(url, init);
  return { status: res.status, body: (await res.json()) as Record<string, unknown>, headers: res.headers };
}

describe('startStanceline', () => {
  it('listens on a free port with embedded S3 and SMTP stand-ins and reports healthy', async () => {
    expect(app.port).toBeGreaterThan(0);
    const health = await json(`${app.url}/api/health`);
    expect(health.status).toBe(200);
    expect(health.body).toEqual({ status: 'ok', checks: { database: true, storage: true } });
    expect(health.headers.get('x-request-id')).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('seeds the demo club: every listed sign-in works with the demo password', async () => {
    const roles = [];
    for (const email of DEMO_SIGN_INS) {
      const res = await json(`${app.url}/api/auth/login`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email, password: DEMO_PASSWORD }),
      });
      expect(res.status, email).toBe(200);
      roles.push((res.body.user as { role: string }).role);
    }
    expect(roles).toEqual(['head_coach', 'coach', 'analyst', 'athlete', 'guardian']);
  });

  it('seeds at least 12 athletes in U10-U16 and two sessions at one venue', async () => {
    const login = await json(`${app.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'head@larchwood.example', password: DEMO_PASSWORD }),
    });
    const auth = { authorization: `Bearer ${login.body.accessToken as string}` };
    const athletes = (await json(`${app.url}/api/athletes`, { headers: auth })).body.athletes as {
      ageGroup: { name: string };
      consent: { status: string };
    }[];
    expect(athletes.length).toBeGreaterThanOrEqual(12);
    expect([...new Set(athletes.map((a) => a.ageGroup.name))].sort()).toEqual(['U10', 'U12', 'U14', 'U16']);
    expect(athletes.some((a) => a.consent.status === 'missing')).toBe(true);
    const sessions = (await json(`${app.url}/api/sessions`, { headers: auth })).body.sessions as {
      venue: string;
    }[];
    expect(sessions).toHaveLength(2);
    expect(new Set(sessions.map((s) => s.venue)).size).toBe(1);
  });

  it('keeps the API error shape for unknown API paths and serves the client elsewhere', async () => {
    const missing = await json(`${app.url}/api/no-such-thing`);
    expect(missing.status).toBe(404);
    expect(missing.body).toEqual({
      error: { code: 'not_found', message: 'No API route GET /api/no-such-thing' },
    });
    const page = await fetch(`${app.url}/athletes/some-id`);
    // Either the built client (SPA fallback) or the clear "build first" message when dist/ is absent.
    const text = await page.text();
    if (page.status === 200) expect(text).toContain('<div id="root">');
    else expect(text).toContain('npm run build');
  });

  it('answers a missing model file with a 404, not the client app', async () => {
    const res = await json(`${app.url}/models/no-such-model/model.json`);
    expect(res.status).toBe(404);
    expect((res.body.error as { code: string }).code).toBe('not_found');
  });

  it('serves the TF.js wasm binaries from its own origin', async () => {
    const res = await fetch(`${app.url}/wasm/tfjs-backend-wasm.wasm`);
    expect(res.status).toBe(200);
    const bytes = new Uint8Array(await res.arrayBuffer());
    // Every WebAssembly module starts with "\0asm" (WebAssembly core spec, binary format 5.5.16).
    expect([...bytes.subarray(0, 4)]).toEqual([0x00, 0x61, 0x73, 0x6d]);
  });

  it('does not seed twice and keeps the JWT secret across restarts', async () => {
    const login = await json(`${app.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'head@larchwood.example', password: DEMO_PASSWORD }),
    });
    const auth = { authorization: `Bearer ${login.body.accessToken as string}` };
    const copy = await copyOf(dataDir);
    const second = await startStanceline({ port: 0, dataDir: copy, logLevel: 'silent' });
    try {
      // A token signed by the first process is valid for the second: the generated secret was persisted.
      const athletes = (await json(`${second.url}/api/athletes`, { headers: auth })).body
        .athletes as unknown[];
      expect(athletes).toHaveLength(14);
    } finally {
      await second.close();
      await fs.rm(copy, { recursive: true, force: true });
    }
  });

  it('close() releases the HTTP port', async () => {
    const dir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-close-'));
    const other = await startStanceline({ port: 0, dataDir: dir, logLevel: 'silent', seedDemo: false });
    await other.close();
    await expect(connect(other.port)).rejects.toThrow(/ECONNREFUSED/);
    await fs.rm(dir, { recursive: true, force: true });
  });
});

async function copyOf(dir: string): Promise<string> {
  const target = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-restart-'));
  // The SQLite file and its WAL are copied together, as a restart on the same folder would find them.
  await fs.cp(dir, target, { recursive: true });
  return target;
}

function connect(port: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      resolve();
    });
    socket.once('error', reject);
  });
}
