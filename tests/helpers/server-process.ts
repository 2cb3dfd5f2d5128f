import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';

/** A free loopback port (asked of the OS, then released). */
export function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const probe = http.createServer().listen(0, '127.0.0.1', () => {
      const port = (probe.address() as { port: number }).port;
      probe.close(() => resolve(port));
    });
  });
}

/**
 * `server/main.ts` as its own process, the way `npm start` runs it (demo club seeded on first start),
 * so a test can kill it with SIGKILL; resolves once /api/health answers.
 */
export async function startServerProcess(
  dataDir: string,
  env: Record<string, string> = {},
  seconds = 90,
): Promise<{ child: ChildProcess; base: string }> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: process.cwd(),
    env: {
      ...process.env,
      DATA_DIR: dataDir,
      PORT: String(port),
      HOST: '127.0.0.1',
      BCRYPT_ROUNDS: '4',
      LOG_LEVEL: 'warn',
      // No pose analysis on the server unless a test asks for it.
      ANALYSIS_WORKERS: '0',
      AUTO_ANALYSIS: 'off',
      ...env,
    },
    // Unread pipes would fill up and stall a chatty child.
    stdio: 'ignore',
  });
  const base = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    const ok = await fetch(`${base}/api/health`).then(
      (r) => r.ok,
      () => false,
    );
    if (ok) return { child, base };
    if (child.exitCode !== null) throw new Error(`the server exited with ${child.exitCode}`);
    if (Date.now() > deadline) throw new Error('the server did not start');
    await new Promise((r) => setTimeout(r, 300));
  }
}

/** Signs in a demo member over HTTP; the Authorization header (JSON bodies) for its calls. */
export async function signInOver(base: string, email: string): Promise<Record<string, string>> {
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: 'stanceline-demo' }),
  });
  const { accessToken } = (await login.json()) as { accessToken: string };
  return { Authorization: `Bearer ${accessToken}`, 'Content-Type': 'application/json' };
}

/** Polls `probe` every 100 ms until it gives a value (not null, not a throw); fails after `seconds`. */
export async function waitFor<T>(what: string, probe: () => Promise<T | null>, seconds = 90): Promise<T> {
  const deadline = Date.now() + seconds * 1000;
  for (;;) {
    const value = await probe().catch(() => null);
    if (value !== null) return value;
    if (Date.now() > deadline) throw new Error(`gave up waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
