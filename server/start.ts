import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import { loadConfig } from './config';
import { createLogger } from './logger';
import { startRuntime } from './runtime';
import { seedDemoClub } from './seed/demo-seed';
import type { Clock } from './services/principal';

export interface StartOptions {
  port?: number;
  dataDir?: string;
  /** Seed the demo club when the database has no club yet (default true). */
  seedDemo?: boolean;
  logLevel?: string;
  /** Settings as environment variables (see server/config.ts), over process.env. */
  env?: Record<string, string>;
  clock?: Clock;
}

export interface StartedStanceline {
  url: string;
  port: number;
  close(): Promise<void>;
  mailbox: { messages(): Promise<{ to: string; subject: string; text: string; html?: string }[]> };
}

/** Starts the whole product: stand-ins when no endpoints are set, migrations, demo seed, HTTP. */
export async function startStanceline(opts: StartOptions = {}): Promise<StartedStanceline> {
  const env: Record<string, string | undefined> = { ...process.env, ...opts.env };
  if (opts.dataDir !== undefined) env.DATA_DIR = opts.dataDir;
  if (opts.port !== undefined) env.PORT = String(opts.port);
  if (opts.logLevel !== undefined) env.LOG_LEVEL = opts.logLevel;
  const config = loadConfig(env);
  const logger = createLogger(config.logLevel);
  const runtime = await startRuntime(config);

  let server: Server | undefined;
  try {
    if (opts.seedDemo ?? true) {
      const seeded = await seedDemoClub(runtime.dataSource, {
        bcryptRounds: config.bcryptRounds,
        clock: opts.clock,
      });
      if (seeded) logger.info({ club: seeded.clubName }, 'seeded the demo club');
    }
    // The public URL depends on the port, which is only known after listen when PORT=0.
    let publicUrl = config.publicUrl ?? '';
    const app = createApp({
      config,
      dataSource: runtime.dataSource,
      storage: runtime.storage,
      mediaQueue: runtime.mediaQueue,
      mailer: runtime.mailer,
      mailbox: runtime.mailbox,
      jwtSecret: runtime.jwtSecret,
      publicUrl: () => publicUrl,
      logger,
      clock: opts.clock,
    });
    server = await new Promise<Server>((resolve, reject) => {
      const s = app.listen(config.port, config.host, () => resolve(s));
      s.once('error', reject);
    });
    // Node's default 5-minute request timeout would cut off long clip uploads on slow rink-side Wi-Fi.
    server.requestTimeout = 0;
    const port = (server.address() as AddressInfo).port;
    const url = `http://localhost:${port}`;
    publicUrl = config.publicUrl ?? url;

    const mailbox = runtime.mailbox ?? { messages: async () => [] };
    const httpServer = server;
    let closed: Promise<void> | undefined;
    return {
      url,
      port,
      mailbox,
      close() {
        closed ??= (async () => {
          httpServer.closeAllConnections();
          await new Promise<void>((resolve) => httpServer.close(() => resolve()));
          await runtime.close();
        })();
        return closed;
      },
    };
  } catch (error) {
    server?.close();
    await runtime.close();
    throw error;
  }
}
