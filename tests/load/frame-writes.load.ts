// npm run load: 50 concurrent clients against a server started for the purpose, on loopback only, for
// LOAD_SECONDS (default 60). Each client analyses a clip of its own (2,000 frames) as the browser does:
// batches of 30 frames from the first to the last, then again with the other model; each finished pass
// makes the server recompute that clip's series. Between batches a client reads one of the club's
// lists. At the end every frame is read back: the stored keypoints must be those of the last
// acknowledged write of that frame. Prints latency per route, errors and the check
// (docs/reliability.md has the figures and the command).
import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { COCO17_NAMES } from '@shared/keypoints';

const CLIENTS = Number(process.env.LOAD_CLIENTS ?? 50);
const SECONDS = Number(process.env.LOAD_SECONDS ?? 60);

const FRAMES_PER_CLIP = 2000;
const MODELS = ['lightning', 'thunder'] as const;
// As the browser posts them while it analyses a clip (ANALYSIS_BATCH_SIZE).
const BATCH = 30;
const WARMUP_SECONDS = Number(process.env.LOAD_WARMUP_SECONDS ?? 5);

interface Slot {
  clipId: string;
  model: (typeof MODELS)[number];
  frame: number;
}

const timings = new Map<string, number[]>();
const errors = new Map<string, number>();

/** Requests started before this moment are the warm-up (a cold server compiles, caches, prepares). */
let measuredFrom = Infinity;
const warmup: number[] = [];

function record(route: string, ms: number, ok: boolean, startedAt: number) {
  if (startedAt < measuredFrom) {
    warmup.push(ms);
    if (!ok) errors.set(route, (errors.get(route) ?? 0) + 1);
    return;
  }
  if (!timings.has(route)) timings.set(route, []);
  timings.get(route)!.push(ms);
  if (!ok) errors.set(route, (errors.get(route) ?? 0) + 1);
}

const pct = (xs: number[], p: number) => {
  const sorted = [...xs].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;
};

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const probe = http.createServer().listen(0, '127.0.0.1', () => {
      const port = (probe.address() as { port: number }).port;
      probe.close(() => resolve(port));
    });
  });
}

/** The version of a write, carried in the keypoints so a read-back tells which write it sees. */
function keypointsFor(version: number, frame: number) {
  return COCO17_NAMES.map((name, i) => ({ name, x: 100 + i + frame / 1000, y: version, score: 0.9 }));
}

async function main() {
  const dataDir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-load-'));
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const server = spawn(
    process.execPath,
    [
      ...(process.env.LOAD_PROFILE ? ['--cpu-prof', '--cpu-prof-dir', process.env.LOAD_PROFILE] : []),
      '--import',
      'tsx',
      'server/main.ts',
    ],
    {
      env: {
        ...process.env,
        DATA_DIR: dataDir,
        PORT: String(port),
        HOST: '127.0.0.1',
        LOG_LEVEL: 'error',
        LOGIN_RATE_LIMIT: '1000',
      },
      stdio: ['ignore', 'ignore', 'inherit'],
    },
  );
  try {
    for (let tries = 0; ; tries++) {
      if (
        await fetch(`${base}/api/health`).then(
          (r) => r.ok,
          () => false,
        )
      )
        break;
      if (tries > 600) throw new Error('the server did not start');
      await new Promise((r) => setTimeout(r, 200));
    }
    const login = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: 'coach@larchwood.example', password: 'stanceline-demo' }),
    });
    const { accessToken } = (await login.json()) as { accessToken: string };
    const auth = { Authorization: `Bearer ${accessToken}`, 'Content-Type': 'application/json' };

    // Five long clips: copies of a ready demo clip of the coach's group, said to have 2,000 frames.
    const db = new Database(path.join(dataDir, 'stanceline.sqlite'));
    const template = db.prepare(`SELECT * FROM clip WHERE status = 'ready' LIMIT 1`).get() as Record<
      string,
      unknown
    >;
    const tags = db.prepare(`SELECT * FROM clip_athlete WHERE clipId = ?`).all(template.id) as Record<
      string,
      unknown
    >[];
    const clipIds: string[] = [];
    for (let i = 0; i < CLIENTS; i++) {
      const id = randomUUID();
      const row = {
        ...template,
        id,
        frameCount: FRAMES_PER_CLIP,
        durationMs: Math.ceil((FRAMES_PER_CLIP / 30) * 1000),
        fps: 30,
      };
      const cols = Object.keys(row);
      db.prepare(
        `INSERT INTO clip (${cols.map((c) => `"${c}"`).join(',')}) VALUES (${cols.map(() => '?').join(',')})`,
      ).run(...cols.map((c) => row[c as keyof typeof row] as never));
      for (const tag of tags) {
        const t = { ...tag, clipId: id };
        const tc = Object.keys(t);
        db.prepare(
          `INSERT INTO clip_athlete (${tc.map((c) => `"${c}"`).join(',')}) VALUES (${tc.map(() => '?').join(',')})`,
        ).run(...tc.map((c) => t[c as keyof typeof t] as never));
      }
      clipIds.push(id);
    }
    db.close();

    // Each client analyses a clip of its own from the first frame to the last, in batches, as the browser
    // does, then again with the other model (frames posted again); the last batch of a pass makes the
    // server recompute the clip's series.
    const acknowledged = new Map<string, number>();
    const uncertain = new Map<string, number>();
    const key = (s: Slot) => `${s.clipId}|${s.model}|${s.frame}`;
    let version = 0;
    let acknowledgedWrites = 0;
    let passesFinished = 0;
    const deadline = Date.now() + SECONDS * 1000;

    const reads = ['/api/clips', '/api/athletes', '/api/sessions'];
    const client = async (c: number) => {
      // Clients start at different points of their clips, so passes end (and series are recomputed)
      // all through the run rather than all at once or never.
      let cursor = Math.floor((c / CLIENTS) * (FRAMES_PER_CLIP / BATCH)) * BATCH;
      while (Date.now() < deadline) {
        const pass = Math.floor(cursor / FRAMES_PER_CLIP);
        const start = cursor % FRAMES_PER_CLIP;
        const first: Slot = { clipId: clipIds[c], model: MODELS[pass % MODELS.length], frame: start };
        const batch: Slot[] = [];
        for (let f = start; f < Math.min(FRAMES_PER_CLIP, start + BATCH); f++)
          batch.push({ ...first, frame: f });
        cursor += batch.length;
        const v = ++version;
        const body = JSON.stringify({
          model: first.model,
          frames: batch.map((s) => ({
            frameIndex: s.frame,
            timeMs: (s.frame * 1000) / 30,
            keypoints: keypointsFor(v, s.frame),
          })),
        });
        const t0 = performance.now();
        let ok = false;
        try {
          const res = await fetch(`${base}/api/clips/${first.clipId}/frames`, {
            method: 'POST',
            headers: auth,
            body,
          });
          ok = res.status === 201 || res.status === 200;
          await res.arrayBuffer();
        } catch {
          ok = false;
        }
        record('POST /api/clips/:id/frames', performance.now() - t0, ok, t0);
        for (const s of batch) (ok ? acknowledged : uncertain).set(key(s), v);
        if (ok) acknowledgedWrites += batch.length;
        if (ok && batch.at(-1)!.frame === FRAMES_PER_CLIP - 1) passesFinished++;
        if (ok) for (const s of batch) uncertain.delete(key(s));

        const path = reads[c % reads.length];
        const t1 = performance.now();
        let readOk = false;
        try {
          const res = await fetch(`${base}${path}`, { headers: auth });
          readOk = res.ok;
          await res.arrayBuffer();
        } catch {
          readOk = false;
        }
        record(`GET ${path}`, performance.now() - t1, readOk, t1);
      }
    };
    const started = performance.now();
    measuredFrom = started + WARMUP_SECONDS * 1000;
    await Promise.all(Array.from({ length: CLIENTS }, (_, c) => client(c)));
    const elapsed = (performance.now() - started) / 1000;

    // Read everything back: each frame must hold its last acknowledged write (or, if the last try
    // failed, that one), none may be missing.
    let checked = 0;
    let wrong = 0;
    let missing = 0;
    for (const clipId of clipIds) {
      for (const model of MODELS) {
        const res = await fetch(`${base}/api/clips/${clipId}/frames?model=${model}`, { headers: auth });
        const { frames } = (await res.json()) as {
          frames: { frameIndex: number; keypoints: { y: number }[] }[];
        };
        const stored = new Map(frames.map((f) => [f.frameIndex, f.keypoints[0]?.y]));
        for (let frame = 0; frame < FRAMES_PER_CLIP; frame++) {
          const k = `${clipId}|${model}|${frame}`;
          const expected = acknowledged.get(k);
          if (expected === undefined) continue;
          checked++;
          const got = stored.get(frame);
          if (got === undefined) missing++;
          else if (got !== expected && got !== uncertain.get(k)) wrong++;
        }
      }
    }

    console.log(
      `${CLIENTS} clients for ${elapsed.toFixed(1)} s against one server process on loopback (${os.cpus().length} cores)`,
    );
    console.log(
      `warm-up (first ${WARMUP_SECONDS} s, not in the table): ${warmup.length} requests, p50 ${pct(warmup, 50).toFixed(0)} ms, max ${pct(warmup, 100).toFixed(0)} ms`,
    );
    console.log(
      'route                              requests      p50 ms      p90 ms      p99 ms      max ms   errors',
    );
    for (const [route, xs] of timings) {
      const cells = [50, 90, 99, 100].map((p) => pct(xs, p).toFixed(0).padStart(11)).join(' ');
      console.log(
        `${route.padEnd(34)} ${String(xs.length).padStart(8)} ${cells} ${String(errors.get(route) ?? 0).padStart(8)}`,
      );
    }
    const frameWrites = acknowledgedWrites;
    console.log(
      `frames acknowledged: ${acknowledged.size} distinct (${frameWrites} writes); read back: ${checked} checked, ${missing} missing, ${wrong} not the last acknowledged write`,
    );
    console.log(`clip passes finished (each one a series recomputed in the background): ${passesFinished}`);
    console.log(
      missing === 0 && wrong === 0 ? 'every acknowledged frame is stored exactly' : 'FRAMES LOST OR WRONG',
    );
    if (missing > 0 || wrong > 0) process.exitCode = 1;
  } finally {
    server.kill('SIGTERM');
    await new Promise((r) => server.once('exit', r));
    await fs.rm(dataDir, { recursive: true, force: true });
  }
}

await main();
