import { z } from 'zod';
import {
  isKeypointName,
  POSE_MODELS,
  VIEWS,
  type Keypoint,
  type PoseModelName,
  type ReferenceLine,
  type View,
} from '@shared/keypoints';

/** A keypoint JSON file the command line cannot read; the message says where and why. */
export class KeypointFileError extends Error {
  override name = 'KeypointFileError';
}

const finite = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .refine(Number.isFinite, { message: `${what} must be finite` });

const keypointSchema = z.object({
  name: z.string({ error: 'name must be a string' }).superRefine((value, ctx) => {
    if (!isKeypointName(value)) ctx.addIssue({ code: 'custom', message: `unknown keypoint name '${value}'` });
  }),
  x: finite('x'),
  y: finite('y'),
  score: finite('score').refine((s) => s >= 0 && s <= 1, { message: 'score must be between 0 and 1' }),
});

const pointSchema = z.tuple([finite('x'), finite('y')], { error: 'a point must be [x, y]' });

const frameSchema = z
  .object({
    keypoints: z.array(keypointSchema, { error: 'keypoints must be a list of {name, x, y, score}' }),
    width: finite('width')
      .refine((v) => v > 0, { message: 'width must be positive' })
      .optional(),
    height: finite('height')
      .refine((v) => v > 0, { message: 'height must be positive' })
      .optional(),
    view: z.enum(VIEWS as [View, ...View[]], { error: `view must be one of ${VIEWS.join(', ')}` }).optional(),
    referenceLine: z
      .tuple([pointSchema, pointSchema], { error: 'referenceLine must be [[x1, y1], [x2, y2]]' })
      .refine(([a, b]) => a[0] !== b[0] || a[1] !== b[1], { message: 'referenceLine points must differ' })
      .nullable()
      .optional(),
    timeMs: finite('timeMs').nullable().optional(),
    frame: z.number().int({ message: 'frame must be a whole number' }).nonnegative().nullable().optional(),
    model: z
      .enum(POSE_MODELS as [PoseModelName, ...PoseModelName[]], {
        error: `model must be one of ${POSE_MODELS.join(', ')}`,
      })
      .nullable()
      .optional(),
  })
  .superRefine((frame, ctx) => {
    const seen = new Set<string>();
    frame.keypoints.forEach((k, i) => {
      if (seen.has(k.name)) {
        ctx.addIssue({
          code: 'custom',
          path: ['keypoints', i, 'name'],
          message: `duplicate keypoint name '${k.name}'`,
        });
      }
      seen.add(k.name);
    });
  });

export interface KeypointFrame {
  frame: number | null;
  timeMs: number | null;
  width: number | null;
  height: number | null;
  model: PoseModelName | null;
  view: View | null;
  referenceLine: ReferenceLine | null;
  keypoints: Keypoint[];
}

function describePath(path: PropertyKey[], isList: boolean): string {
  const parts = [...path];
  let where = '';
  if (isList && typeof parts[0] === 'number') where = `frame ${String(parts.shift())}: `;
  let field = '';
  for (const p of parts) field += typeof p === 'number' ? `[${p}]` : field ? `.${String(p)}` : String(p);
  return where + (field ? `${field}: ` : '');
}

/** Parses the text of a keypoint JSON file: one frame object or a list of them. */
export function parseKeypointFile(text: string): KeypointFrame[] {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    throw new KeypointFileError(`not valid JSON (${(error as Error).message})`);
  }
  const isList = Array.isArray(data);
  if (!isList && (typeof data !== 'object' || data === null)) {
    throw new KeypointFileError('expected a frame object {"keypoints": [...]} or a list of them');
  }
  if (isList && (data as unknown[]).length === 0) throw new KeypointFileError('the list of frames is empty');
  // A union error hides the real issue; check the shape the file chose.
  const parsed = (isList ? z.array(frameSchema) : frameSchema).safeParse(data);
  if (!parsed.success) {
    const issues = parsed.error.issues.slice(0, 5).map((i) => describePath(i.path, isList) + i.message);
    const more = parsed.error.issues.length > 5 ? ` (and ${parsed.error.issues.length - 5} more)` : '';
    throw new KeypointFileError(issues.join('; ') + more);
  }
  const frames = Array.isArray(parsed.data) ? parsed.data : [parsed.data];
  return frames.map((f, i) => ({
    frame: f.frame ?? (isList ? i : null),
    timeMs: f.timeMs ?? null,
    width: f.width ?? null,
    height: f.height ?? null,
    model: f.model ?? null,
    view: f.view ?? null,
    referenceLine: (f.referenceLine as ReferenceLine | null | undefined) ?? null,
    keypoints: f.keypoints.map((k) => ({ name: k.name as Keypoint['name'], x: k.x, y: k.y, score: k.score })),
  }));
}
