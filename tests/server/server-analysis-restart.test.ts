import type { ChildProcess } from 'node:child_process';
import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto, ServerAnalysisDto } from '@shared/schemas/clip.schema';
import { startStanceline } from '@server/start';
import { signInOver, startServerProcess, waitFor } from '../helpers/server-process';

// A clip analysed on the server is a durable job: a server killed in the middle of it goes on after
// the last stored batch at its next start; each frame is read and stored once.

let child: ChildProcess | undefined;
let dataDir: string;

beforeAll(async () => {
  dataDir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-analysis-'));
});
afterAll(async () => {
  child?.kill('SIGKILL');
  await fs.rm(dataDir, { recursive: true, force: true });
});

interface FrameRow {
  frameIndex: number;
  updatedAt: string;
}

describe('a server killed while it analyses a clip', () => {
  it(
    'resumes after a restart after the last stored batch and stores each frame once',
    { timeout: 300_000 },
    async () => {
      // A second and a half between batches of ten frames, so the kill lands part way.
      const started = await startServerProcess(
        dataDir,
        { ANALYSIS_WORKERS: '2', JOB_STEP_PAUSE: '1500ms' },
        180,
      );
      child = started.child;
      const auth = await signInOver(started.base, 'head@larchwood.example');
      const clips = (await (await fetch(`${started.base}/api/clips`, { headers: auth })).json()) as {
        clips: ClipDto[];
      };
      const clip = clips.clips.find((c) => c.originalName === 'phantom-front-turns.mp4')!;
      const queued = await fetch(`${started.base}/api/clips/${clip.id}/server-analysis`, {
        method: 'POST',
        headers: auth,
        body: JSON.stringify({ fromStart: true }),
      });
      expect(queued.status).toBe(202);
      const clipUrl = `${started.base}/api/clips/${clip.id}`;
      const partway = await waitFor('the first stored batch', async () => {
        const view = ((await (await fetch(clipUrl, { headers: auth })).json()) as { clip: ClipDto }).clip
          .serverAnalysis;
        return view && view.status === 'running' && view.done > 0 ? view : null;
      });
      child.kill('SIGKILL');
      await new Promise((r) => child!.once('exit', r));
      expect(partway.done).toBeLessThan(partway.total);

      const dbPath = path.join(dataDir, 'stanceline.sqlite');
      const db = new Database(dbPath, { readonly: true });
      const job = db.prepare(`SELECT status, done, cursor FROM job WHERE id = ?`).get(partway.jobId) as {
        status: string;
        done: number;
        cursor: string;
      };
      const cursor = Number(job.cursor);
      const before = db
        .prepare(
          `SELECT frameIndex, updatedAt FROM frame_result WHERE clipId = ? AND model = 'lightning' AND frameIndex <= ? ORDER BY frameIndex`,
        )
        .all(clip.id, cursor) as FrameRow[];
      db.close();
      expect(job.status).toBe('running');
      expect(job.done).toBe(cursor + 1);
      expect(before).toHaveLength(cursor + 1);
      const killedAt = new Date();

      const again = await startStanceline({
        port: 0,
        dataDir,
        logLevel: 'silent',
        env: { BCRYPT_ROUNDS: '4', ANALYSIS_WORKERS: '2' },
      });
      let finished: ServerAnalysisDto;
      try {
        const auth2 = await signInOver(again.url, 'head@larchwood.example');
        finished = await waitFor('the resumed analysis', async () => {
          const view = (
            (await (await fetch(`${again.url}/api/clips/${clip.id}`, { headers: auth2 })).json()) as {
              clip: ClipDto;
            }
          ).clip.serverAnalysis;
          return view && view.jobId === partway.jobId && view.status === 'done' ? view : null;
        });
      } finally {
        await again.close();
      }
      expect(finished.done).toBe(clip.frameCount);

      const check = new Database(dbPath, { readonly: true });
      try {
        const rows = check
          .prepare(
            `SELECT frameIndex, updatedAt FROM frame_result WHERE clipId = ? AND model = 'lightning' ORDER BY frameIndex`,
          )
          .all(clip.id) as FrameRow[];
        // Every frame once.
        expect(rows.map((r) => r.frameIndex)).toEqual([...Array(clip.frameCount!).keys()]);
        // The frames stored before the kill were not read or stored again...
        for (const row of before) {
          expect(rows[row.frameIndex].updatedAt, `frame ${row.frameIndex}`).toBe(row.updatedAt);
        }
        // ...and every frame after them was stored by the resumed run.
        for (const row of rows.slice(cursor + 1)) {
          expect(new Date(`${row.updatedAt}Z`).getTime(), `frame ${row.frameIndex}`).toBeGreaterThanOrEqual(
            killedAt.getTime() - 1000,
          );
        }
      } finally {
        check.close();
      }
    },
  );
});
