import { EntitySchema } from 'typeorm';
import type { NoteDrawing } from '@shared/schemas/note.schema';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

/** A coach's note pinned to a moment of a clip, optionally with a drawing on that frame. */
export interface Note {
  id: string;
  clipId: string;
  authorId: string | null;
  timeMs: number;
  frameIndex: number | null;
  body: string;
  /** Strokes, arrows and angles in the playable video's pixels. */
  drawing: NoteDrawing | null;
  createdAt: Date;
  updatedAt: Date;
}

export const NoteEntity = new EntitySchema<Note>({
  name: 'Note',
  tableName: 'note',
  columns: {
    id: idColumn,
    clipId: uuidColumn,
    authorId: nullableUuidColumn,
    timeMs: { type: 'real' },
    frameIndex: { type: 'integer', nullable: true },
    body: { type: 'text' },
    drawing: { type: 'simple-json', nullable: true },
    createdAt: timestampColumn,
    updatedAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Clip', 'clipId', 'CASCADE'), foreignKey('User', 'authorId', 'SET NULL')],
  indices: [{ name: 'IDX_note_clip_time', columns: ['clipId', 'timeMs'] }],
});
