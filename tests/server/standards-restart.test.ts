import type { ChildProcess } from 'node:child_process';
import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStanceline } from '@server/start';
import { signInOver, startServerProcess, waitFor } from '../helpers/server-process';

// A band change's re-check is a durable job: a server killed in the middle of it goes on after the
// last finished step at its next start, and no flag is stored twice.

let child: ChildProcess | undefined;
let dataDir: string;

beforeAll(async () => {
  dataDir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-jobs-'));
});
afterAll(async () => {
  child?.kill('SIGKILL');
  await fs.rm(dataDir, { recursive: true, force: true });
});

interface JobView {
  status: string;
  done: number;
  total: number;
}

describe('a server killed while it re-checks flags', () => {
  it(
    'resumes the job after a restart and finishes it, with every flag once',
    { timeout: 240_000 },
    async () => {
      // Two seconds between steps, so the kill lands between the first and the last clip.
      const started = await startServerProcess(dataDir, { JOB_STEP_PAUSE: '2000ms' }, 180);
      child = started.child;
      const base = started.base;
      const auth = await signInOver(base, 'head@larchwood.example');
      const groups = (await (await fetch(`${base}/api/age-groups`, { headers: auth })).json()) as {
        ageGroups: { id: string; name: string }[];
      };
      const u14 = groups.ageGroups.find((g) => g.name === 'U14')!.id;
      // Knees at least 1.1 hip widths apart: the phantom skier (0.92 to 1.04) is outside in every turn.
      const put = await fetch(`${base}/api/tolerance-bands/${u14}/kneeSeparationRatio`, {
        method: 'PUT',
        headers: auth,
        body: JSON.stringify({ min: 1.1, max: 1.4, target: 1.2 }),
      });
      expect(put.status).toBe(200);
      const { job, band } = (await put.json()) as { job: { id: string }; band: { version: number } };
      const jobUrl = `${base}/api/jobs/${job.id}`;
      const partway = await waitFor('the first finished step', async () => {
        const view = (await (await fetch(jobUrl, { headers: auth })).json()) as JobView;
        return view.status === 'running' && view.done > 0 ? view : null;
      });
      child.kill('SIGKILL');
      await new Promise((r) => child!.once('exit', r));
      expect(partway.done).toBeLessThan(partway.total);

      const db = new Database(path.join(dataDir, 'stanceline.sqlite'), { readonly: true });
      const stored = db.prepare(`SELECT status, done, cursor FROM job WHERE id = ?`).get(job.id) as {
        status: string;
        done: number;
        cursor: string | null;
      };
      db.close();
      expect(stored.status).toBe('running');
      expect(stored.cursor).not.toBeNull();

      const again = await startStanceline({
        port: 0,
        dataDir,
        logLevel: 'silent',
        env: { BCRYPT_ROUNDS: '4' },
      });
      try {
        const auth2 = await signInOver(again.url, 'head@larchwood.example');
        const finished = await waitFor('the resumed job', async () => {
          const view = (await (
            await fetch(`${again.url}/api/jobs/${job.id}`, { headers: auth2 })
          ).json()) as JobView;
          return view.status === 'done' ? view : null;
        });
        expect(finished.done).toBe(finished.total);
        expect(finished.total).toBe(partway.total);
      } finally {
        await again.close();
      }

      const check = new Database(path.join(dataDir, 'stanceline.sqlite'), { readonly: true });
      try {
        const twice = check
          .prepare(
            `SELECT clipId, model, metric, groupKey, COUNT(*) AS n FROM flag GROUP BY clipId, model, metric, groupKey HAVING n > 1`,
          )
          .all();
        expect(twice).toEqual([]);
        // Every front clip of a U14 athlete now carries knee flags of the new band version, in each turn.
        const perClip = check
          .prepare(
            `SELECT f.clipId, COUNT(*) AS n, MIN(f.bandVersion) AS lowest, MAX(f.bandMin) AS bandMin
             FROM flag f JOIN athlete a ON a.id = f.athleteId
            WHERE f.metric = 'kneeSeparationRatio' AND a.ageGroupId = ? GROUP BY f.clipId`,
          )
          .all(u14) as { clipId: string; n: number; lowest: number; bandMin: number }[];
        const frontClips = check
          .prepare(
            `SELECT COUNT(DISTINCT c.id) AS n FROM clip c JOIN clip_athlete ca ON ca.clipId = c.id
             JOIN athlete a ON a.id = ca.athleteId JOIN frame_result fr ON fr.clipId = c.id
            WHERE a.ageGroupId = ? AND c.view = 'front'`,
          )
          .get(u14) as { n: number };
        expect(frontClips.n).toBeGreaterThanOrEqual(2);
        expect(perClip).toHaveLength(frontClips.n);
        for (const row of perClip) {
          expect(row.lowest).toBe(band.version);
          expect(row.bandMin).toBe(1.1);
          expect(row.n).toBeGreaterThanOrEqual(3);
        }
      } finally {
        check.close();
      }
    },
  );
});
