// npm run -s analyze -- [--model lightning|thunder|blazepose] [--view front|side] [--facing toward|away] [--pick X,Y[@FRAME]] [--careful] [--every N] [--json] FILE...
import { readFile } from 'node:fs/promises';
import { extname } from 'node:path';
import { parseArgs } from 'node:util';
import {
  POSE_MODELS,
  SKIER_FACINGS,
  VIEWS,
  type PoseModelName,
  type SkierFacing,
  type View,
} from '@shared/keypoints';
import { orientKeypoints } from '@shared/pose/keypoint-mapping';
import { GeometryInputError } from '@shared/geometry';
import { KeypointFileError, parseKeypointFile } from './keypoint-file';
import { loadMediaModule } from './media-input';
import { reportFrame, toJsonLine, toTable, type FrameReport } from './frame-report';

const USAGE = `usage: npm run -s analyze -- [--model lightning|thunder|blazepose] [--view front|side] [--facing toward|away] [--pick X,Y[@FRAME]] [--careful] [--every N] [--json] FILE...
  .json files hold keypoints ({"keypoints": [{"name","x","y","score"}], ...} or a list of such frames);
  images and videos go through the pose pipeline.
  --facing away: a front view filmed from behind; left and right are swapped to the skier's own, as
  the app does for a clip marked "filmed from behind".
  --pick X,Y[@FRAME]: follow the athlete at pixel X,Y of frame FRAME (default 0) when others are in
  the frame, as the app does after the coach clicks on them; earlier frames are skipped.
  --careful: read each frame (or the followed athlete's box) with its mirror image too and average
  the two, as the app's "Careful reading" does; two to four times as long.`;

class UsageError extends Error {}

interface Options {
  model: PoseModelName;
  view: View | null;
  facing: SkierFacing;
  pick: { x: number; y: number; frame: number } | null;
  careful: boolean;
  every: number;
  json: boolean;
  files: string[];
}

function parseOptions(argv: string[]): Options | 'help' {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      strict: true,
      options: {
        model: { type: 'string' },
        view: { type: 'string' },
        facing: { type: 'string' },
        pick: { type: 'string' },
        every: { type: 'string' },
        careful: { type: 'boolean', default: false },
        json: { type: 'boolean', default: false },
        help: { type: 'boolean', short: 'h', default: false },
      },
    });
  } catch (error) {
    throw new UsageError((error as Error).message);
  }
  const { values, positionals } = parsed;
  if (values.help) return 'help';
  const model = (values.model ?? 'lightning') as PoseModelName;
  if (!POSE_MODELS.includes(model)) throw new UsageError(`--model must be one of ${POSE_MODELS.join(', ')}`);
  const view = (values.view ?? null) as View | null;
  if (view !== null && !VIEWS.includes(view))
    throw new UsageError(`--view must be one of ${VIEWS.join(', ')}`);
  const facing = (values.facing ?? 'toward') as SkierFacing;
  if (!SKIER_FACINGS.includes(facing))
    throw new UsageError(`--facing must be one of ${SKIER_FACINGS.join(', ')}`);
  let pick: Options['pick'] = null;
  if (values.pick !== undefined) {
    const m = /^(\d+(?:\.\d+)?),(\d+(?:\.\d+)?)(?:@(\d+))?$/.exec(values.pick);
    if (!m) throw new UsageError('--pick must be X,Y or X,Y@FRAME in pixels of the frame, e.g. 412,230@15');
    pick = { x: Number(m[1]), y: Number(m[2]), frame: m[3] === undefined ? 0 : Number(m[3]) };
  }
  const every = values.every === undefined ? 1 : Number(values.every);
  if (!Number.isInteger(every) || every < 1)
    throw new UsageError('--every must be a whole number of at least 1');
  if (positionals.length === 0) throw new UsageError('no input files');
  return {
    model,
    view,
    facing,
    pick,
    careful: values.careful ?? false,
    every,
    json: values.json ?? false,
    files: positionals,
  };
}

async function* framesOf(file: string, options: Options): AsyncGenerator<FrameReport> {
  if (extname(file).toLowerCase() === '.json') {
    if (options.pick)
      throw new KeypointFileError('--pick reads images and videos; a keypoint file holds its points already');
    if (options.careful)
      throw new KeypointFileError(
        '--careful reads images and videos; a keypoint file holds its points already',
      );
    let text: string;
    try {
      text = await readFile(file, 'utf8');
    } catch (error) {
      throw new KeypointFileError(
        `cannot read file (${(error as NodeJS.ErrnoException).code ?? (error as Error).message})`,
      );
    }
    for (const f of parseKeypointFile(text)) {
      yield reportFrame({
        file,
        ...f,
        keypoints: orientKeypoints(f.keypoints, options.facing),
        view: options.view ?? f.view,
      });
    }
    return;
  }
  const media = await loadMediaModule();
  const progress = process.stderr.isTTY
    ? (done: number, total: number | null) =>
        process.stderr.write(`\r${file}: ${done}${total ? `/${total}` : ''} frames`)
    : undefined;
  try {
    for await (const f of media.analyzeMediaFile(file, {
      model: options.model,
      every: options.every,
      pick: options.pick,
      careful: options.careful,
      onProgress: progress,
    })) {
      yield reportFrame({
        file,
        ...f,
        keypoints: orientKeypoints(f.keypoints, options.facing),
        view: options.view,
        referenceLine: null,
        lostReason: f.lostReason ?? null,
      });
    }
  } catch (error) {
    if (error instanceof media.MediaInputError) throw new KeypointFileError((error as Error).message);
    throw error;
  } finally {
    if (progress) process.stderr.write('\n');
  }
}

async function main(argv: string[]): Promise<number> {
  let options: Options | 'help';
  try {
    options = parseOptions(argv);
  } catch (error) {
    process.stderr.write(`analyze: ${(error as Error).message}\n${USAGE}\n`);
    return 2;
  }
  if (options === 'help') {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  let failures = 0;
  for (const file of options.files) {
    try {
      for await (const report of framesOf(file, options)) {
        process.stdout.write(options.json ? `${toJsonLine(report)}\n` : `${toTable(report)}\n\n`);
      }
    } catch (error) {
      failures++;
      const known = error instanceof KeypointFileError || error instanceof GeometryInputError;
      const message = known
        ? (error as Error).message
        : `unexpected error: ${(error as Error)?.message ?? String(error)}`;
      process.stderr.write(`analyze: ${file}: ${message}\n`);
    }
  }
  return failures > 0 ? 1 : 0;
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    process.stderr.write(`analyze: unexpected error: ${(error as Error)?.message ?? String(error)}\n`);
    process.exitCode = 1;
  },
);
