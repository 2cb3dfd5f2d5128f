import { MAX_CLIP_TIME_MS } from './frames.schema';
import { z } from 'zod';

const COORDINATE_LIMIT = 100_000;
export const MAX_NOTE_LENGTH = 4000;

/** A point in the playable video's pixel space (x right, y down). */
const pointSchema = z.tuple([
  z.number().min(-COORDINATE_LIMIT).max(COORDINATE_LIMIT),
  z.number().min(-COORDINATE_LIMIT).max(COORDINATE_LIMIT),
]);

/** CSS-style colours only: a drawing is shown back to others, so no free text goes through here. */
const colorSchema = z.string().regex(/^#(?:[0-9a-fA-F]{3}|[0-9a-fA-F]{6})$/, 'Use a colour like #1e88e5');

export const noteDrawingSchema = z.object({
  strokes: z
    .array(z.object({ points: z.array(pointSchema).min(1).max(5000), color: colorSchema }))
    .max(200)
    .default([]),
  arrows: z
    .array(z.object({ from: pointSchema, to: pointSchema, color: colorSchema }))
    .max(200)
    .default([]),
  angles: z
    .array(
      z.object({
        a: pointSchema,
        vertex: pointSchema,
        b: pointSchema,
        degrees: z.number().min(0).max(360),
      }),
    )
    .max(200)
    .default([]),
});
export type NoteDrawing = z.infer<typeof noteDrawingSchema>;

const noteTextSchema = z
  .string()
  .trim()
  .min(1, 'Write the note first')
  .max(MAX_NOTE_LENGTH, `Keep a note under ${MAX_NOTE_LENGTH} characters`);

export const createNoteSchema = z.object({
  timeMs: z.number().min(0).max(MAX_CLIP_TIME_MS, 'Times past 6 hours are not clip times'),
  frameIndex: z.number().int().min(0).nullable().optional(),
  text: noteTextSchema,
  drawing: noteDrawingSchema.nullable().optional(),
});
export type CreateNoteInput = z.input<typeof createNoteSchema>;
/** As the server receives it, after parsing (drawing lists filled in). */
export type CreateNoteBody = z.infer<typeof createNoteSchema>;

export const updateNoteSchema = z
  .object({
    timeMs: z.number().min(0).max(MAX_CLIP_TIME_MS, 'Times past 6 hours are not clip times').optional(),
    frameIndex: z.number().int().min(0).nullable().optional(),
    text: noteTextSchema.optional(),
    drawing: noteDrawingSchema.nullable().optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), 'Change at least one field');
export type UpdateNoteInput = z.input<typeof updateNoteSchema>;
export type UpdateNoteBody = z.infer<typeof updateNoteSchema>;

export interface NoteDto {
  id: string;
  clipId: string;
  timeMs: number;
  frameIndex: number | null;
  text: string;
  drawing: NoteDrawing | null;
  /** Null when the author's account was removed. */
  author: { id: string; name: string } | null;
  createdAt: string;
  updatedAt: string;
}

export interface NoteResponse {
  note: NoteDto;
}
export interface NoteListResponse {
  notes: NoteDto[];
}
