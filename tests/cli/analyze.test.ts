import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { METRIC_KEYS } from '@shared/metrics';

const root = fileURLToPath(new URL('../..', import.meta.url));
const tsx = `${root}node_modules/tsx/dist/cli.mjs`;

function analyze(...args: string[]) {
  const r = spawnSync(process.execPath, [tsx, 'server/cli/analyze.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
  });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr, lines: r.stdout.split('\n').filter(Boolean) };
}

const CONTRACT_KEYS = [
  'file',
  'frame',
  'timeMs',
  'width',
  'height',
  'model',
  'view',
  'keypoints',
  'metrics',
  'reasons',
];

describe('analyze --json on keypoint files', () => {
  it('prints one contract line for a single-frame file', () => {
    const r = analyze('--json', 'fixtures/keypoints/side-coco.json');
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.lines).toHaveLength(1);
    const line = JSON.parse(r.lines[0]);
    expect(Object.keys(line)).toEqual(CONTRACT_KEYS);
    expect(Object.keys(line.metrics)).toEqual([...METRIC_KEYS]);
    expect(line).toMatchObject({
      file: 'fixtures/keypoints/side-coco.json',
      frame: null,
      timeMs: null,
      width: 400,
      height: 400,
      model: null,
      view: 'side',
    });
    expect(line.keypoints).toHaveLength(17);
    expect(Object.keys(line.keypoints[0])).toEqual(['name', 'x', 'y', 'score']);
    // The fixture is the side worked example: 3-4-5 left leg (90° at the knee), 30/60/90 right leg.
    expect(line.metrics.kneeFlexionLeft).toBeCloseTo(90, 6);
    expect(line.metrics.kneeFlexionRight).toBeCloseTo(60, 6);
    expect(line.metrics.foreAftOffset).toBeCloseTo(20 / 45, 6);
    expect(line.metrics.inclination).toBeNull();
    expect(line.reasons.inclination).toBe('wrong view');
  });

  it('prints one line per frame of a list, with frame numbers, times and per-frame reasons', () => {
    const r = analyze('--json', 'fixtures/keypoints/front-blazepose.json');
    expect(r.code).toBe(0);
    const lines = r.lines.map((l) => JSON.parse(l));
    expect(lines.map((l) => [l.frame, l.timeMs, l.model, l.view])).toEqual([
      [0, 0, 'blazepose', 'front'],
      [1, 33.3, 'blazepose', 'front'],
      [2, 66.7, 'blazepose', 'front'],
    ]);
    // Front worked example: ankle-mid → hip-mid (60,80), a 3-4-5 lean of 36.87°.
    expect(lines[0].metrics.inclination).toBeCloseTo((Math.atan2(3, 4) * 180) / Math.PI, 6);
    expect(lines[1].metrics.kneeSeparationRatio).toBeNull();
    expect(lines[1].reasons.kneeSeparationRatio).toBe('missing: left_knee');
    expect(lines[2].metrics.inclination).toBeCloseTo(lines[0].metrics.inclination, 9);
  });

  it('lets --view override the file and marks metrics of the other view', () => {
    const line = JSON.parse(
      analyze('--json', '--view', 'front', 'fixtures/keypoints/side-coco.json').lines[0],
    );
    expect(line.view).toBe('front');
    expect(line.metrics.kneeFlexionLeft).toBeNull();
    expect(line.reasons.kneeFlexionLeft).toBe('wrong view');
  });

  it('gives every metric null with "no skier found" for a frame without keypoints', () => {
    const line = JSON.parse(analyze('--json', 'fixtures/keypoints/no-skier.json').lines[0]);
    for (const key of METRIC_KEYS) {
      expect(line.metrics[key]).toBeNull();
      expect(line.reasons[key]).toBe('no skier found');
    }
  });

  it('prints a readable table without --json', () => {
    const r = analyze('fixtures/keypoints/side-coco.json');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/kneeFlexionLeft\s+90\.0°/);
    expect(r.stdout).toMatch(/inclination\s+—\s+wrong view/);
  });
});

describe('analyze on bad input', () => {
  it.each([
    ['unknown-name.json', "keypoints[0].name: unknown keypoint name 'left_toe'"],
    ['nan.json', 'not valid JSON'],
    ['wrong-shape.json', 'frame 1: keypoints: keypoints must be a list of {name, x, y, score}'],
    ['bad-reference-line.json', 'referenceLine must be [[x1, y1], [x2, y2]]'],
    ['string-coordinate.json', 'keypoints[0].x: x must be a number'],
  ])('%s: a clear error on stderr, non-zero exit, no stack trace', (file, message) => {
    const r = analyze('--json', `fixtures/keypoints/invalid/${file}`);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(`analyze: fixtures/keypoints/invalid/${file}: `);
    expect(r.stderr).toContain(message);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('still prints the good files when one is bad, and exits non-zero', () => {
    const r = analyze('--json', 'fixtures/keypoints/invalid/nan.json', 'fixtures/keypoints/side-coco.json');
    expect(r.code).toBe(1);
    expect(r.lines).toHaveLength(1);
    expect(r.stderr.split('\n').filter(Boolean)).toHaveLength(1);
  });

  it('--facing away swaps left and right to the skier’s own, as the browser does for a clip filmed from behind', () => {
    const file = 'fixtures/keypoints/front-blazepose.json';
    const toward = JSON.parse(analyze('--json', file).lines[0]);
    const away = JSON.parse(analyze('--json', '--facing', 'away', file).lines[0]);
    type Point = { name: string; x: number; y: number };
    const at = (line: { keypoints: Point[] }, name: string) => line.keypoints.find((k) => k.name === name)!;
    // The point the model called left is now the right one, at the same place.
    expect(at(away, 'right_knee')).toMatchObject({
      x: at(toward, 'left_knee').x,
      y: at(toward, 'left_knee').y,
    });
    expect(at(away, 'nose')).toEqual(at(toward, 'nose'));
    // Leans and tilts toward the skier's left change sign; widths do not change.
    expect(away.metrics.inclination).toBeCloseTo(-toward.metrics.inclination, 9);
    expect(away.metrics.shoulderTilt).toBeCloseTo(-toward.metrics.shoulderTilt, 9);
    expect(away.metrics.stanceWidthRatio).toBeCloseTo(toward.metrics.stanceWidthRatio, 9);
  });

  it('names a file that cannot be read', () => {
    const r = analyze('--json', 'fixtures/keypoints/does-not-exist.json');
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('cannot read file (ENOENT)');
  });

  it.each([
    [[], 'no input files'],
    [['--every', '0', 'a.json'], '--every must be a whole number'],
    [['--model', 'huge', 'a.json'], '--model must be one of lightning, thunder, blazepose'],
    [['--view', 'top', 'a.json'], '--view must be one of front, side'],
    [['--facing', 'sideways', 'a.json'], '--facing must be one of toward, away'],
    [['--bogus', 'a.json'], "Unknown option '--bogus'"],
  ])('rejects bad arguments %j with usage and exit code 2', (args, message) => {
    const r = analyze(...args);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(message);
    expect(r.stderr).toContain('usage:');
  });

  it("passes the pose pipeline's own input errors on clearly", () => {
    const r = analyze('--json', 'fixtures/keypoints/no-such-clip.mp4');
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^analyze: fixtures\/keypoints\/no-such-clip\.mp4: \S/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});
