import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import type { Keypoint } from '@shared/keypoints';
import {
  renderPhantomGroup,
  type PhantomFrameSpec,
  type PhantomTruth,
} from '../../fixtures/phantom/render-phantom';
import { evaluateFrame, pooledErrors } from '../pose/phantom-eval';

// `analyze --pick X,Y` on a still with two phantom skiers (docs/metrics.md, "Picking the athlete"):
// without it the detector reads whichever skier it takes; with it, the one at the point, as the app
// does after the coach clicks on them; with `--careful` too, the box and its mirror image averaged.

const root = fileURLToPath(new URL('../..', import.meta.url));
const tsx = `${root}node_modules/tsx/dist/cli.mjs`;
const dir = mkdtempSync(join(tmpdir(), 'stanceline-pick-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function analyze(...args: string[]) {
  const r = spawnSync(process.execPath, [tsx, 'server/cli/analyze.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
  });
  return { code: r.status, stderr: r.stderr, lines: r.stdout.split('\n').filter(Boolean) };
}

const base = { width: 960, height: 540, roll: 0, seed: 5 } as const;
// A large skier in the middle, and a smaller one up the hill to the left: the one the coach means.
const big: PhantomFrameSpec = {
  ...base,
  pose: { view: 'front', facing: 'toward', inclination: -12 },
  skierHeight: 300,
  origin: [560, 520],
  outfit: 2,
};
const small: PhantomFrameSpec = {
  ...base,
  pose: { view: 'front', facing: 'toward', inclination: 15 },
  skierHeight: 170,
  origin: [190, 330],
  outfit: 0,
};

const error = (keypoints: Keypoint[], truth: PhantomTruth) =>
  pooledErrors([evaluateFrame(keypoints, truth)]).median;

describe('analyze --pick', () => {
  it('reads the skier at the point, not the one the detector would take', async () => {
    const group = renderPhantomGroup([big, small]);
    const [bigTruth, smallTruth] = group.truths;
    const file = join(dir, 'two-skiers.png');
    writeFileSync(file, await group.png());
    const hip = smallTruth.joints.left_hip;

    const plain = JSON.parse(analyze('--json', file).lines[0]);
    expect(error(plain.keypoints, bigTruth)).toBeLessThan(error(plain.keypoints, smallTruth));

    const picked = analyze('--json', '--pick', `${Math.round(hip[0])},${Math.round(hip[1])}`, file);
    expect(picked.code, picked.stderr).toBe(0);
    const line = JSON.parse(picked.lines[0]);
    expect(error(line.keypoints, smallTruth)).toBeLessThan(0.15);
    expect(Math.sign(line.metrics.inclination)).toBe(Math.sign(smallTruth.metrics.inclination!));

    // Careful reading of the same pick: the box and its mirror image averaged, still the skier at the point.
    const careful = analyze(
      '--json',
      '--careful',
      '--pick',
      `${Math.round(hip[0])},${Math.round(hip[1])}`,
      file,
    );
    expect(careful.code, careful.stderr).toBe(0);
    const carefulLine = JSON.parse(careful.lines[0]);
    expect(error(carefulLine.keypoints, smallTruth)).toBeLessThan(0.15);
    expect(carefulLine.keypoints).not.toEqual(line.keypoints);

    // On empty snow: no one, and the frame says so.
    const none = JSON.parse(analyze('--json', '--pick', '20,20', file).lines[0]);
    expect(none.keypoints).toEqual([]);
    expect(none.reasons.inclination).toMatch(/no one found at that point/);
  }, 120_000);

  it.each([
    [['--pick', 'left', 'a.png'], '--pick must be X,Y or X,Y@FRAME'],
    [['--pick', '10,20@x', 'a.png'], '--pick must be X,Y or X,Y@FRAME'],
  ])('rejects %j with usage and exit code 2', (args, message) => {
    const r = analyze(...args);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(message);
  });

  it('refuses a pick or a careful reading on a keypoint file', () => {
    const r = analyze('--json', '--pick', '10,10', 'fixtures/keypoints/side-coco.json');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('--pick reads images and videos');
    const c = analyze('--json', '--careful', 'fixtures/keypoints/side-coco.json');
    expect(c.code).toBe(1);
    expect(c.stderr).toContain('--careful reads images and videos');
  });
});
