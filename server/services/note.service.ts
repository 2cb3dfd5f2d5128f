import { randomUUID } from 'node:crypto';
import type {
  CreateNoteBody,
  NoteDto,
  NoteListResponse,
  NoteResponse,
  UpdateNoteBody,
} from '@shared/schemas/note.schema';
import type { Note } from '../entities/note.entity';
import type { Clip } from '../entities/clip.entity';
import { badRequest, forbidden, notFound } from '../errors';
import type { AuditService } from './audit.service';
import type { ClipAnalysisService } from './clip-analysis.service';
import type { ClipService } from './clip.service';
import { notesToWebVtt } from './notes-vtt';
import type { Clock, Principal } from './principal';
import type { UnitOfWork } from '../repositories/unit-of-work';

/** A note's frame must be one of the clip's frames (when the clip's length is known). */
function checkFrame(clip: Clip, frameIndex: number | null | undefined): void {
  if (frameIndex === null || frameIndex === undefined || clip.frameCount === null) return;
  if (frameIndex >= clip.frameCount) {
    throw badRequest(
      'validation_failed',
      `frameIndex: frame ${frameIndex} is past the clip's last frame (${clip.frameCount - 1})`,
      {
        issues: [
          {
            path: ['frameIndex'],
            code: 'too_big',
            message: `past the clip's last frame (${clip.frameCount - 1})`,
          },
        ],
      },
    );
  }
}

/** A note's time must fall inside the clip (one frame of slack for rounding at the end). */
function checkTime(clip: Clip, timeMs: number | undefined): void {
  if (timeMs === undefined || clip.durationMs === null) return;
  const lastMs = clip.durationMs + (clip.fps ? 1000 / clip.fps : 0);
  if (timeMs > lastMs) {
    throw badRequest(
      'validation_failed',
      `timeMs: ${timeMs} ms is past the clip's end (${clip.durationMs} ms)`,
      {
        issues: [
          { path: ['timeMs'], code: 'too_big', message: `past the clip's end (${clip.durationMs} ms)` },
        ],
      },
    );
  }
}

export function toNoteDto(note: Note, authorName: string | null): NoteDto {
  return {
    id: note.id,
    clipId: note.clipId,
    timeMs: note.timeMs,
    frameIndex: note.frameIndex,
    text: note.body,
    drawing: note.drawing,
    author: note.authorId && authorName !== null ? { id: note.authorId, name: authorName } : null,
    createdAt: note.createdAt.toISOString(),
    updatedAt: note.updatedAt.toISOString(),
  };
}

/** Coaches' notes pinned to moments of a clip. Athletes and guardians see them only once published. */
export class NoteService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly clips: ClipService,
    private readonly analysis: ClipAnalysisService,
    private readonly audit: AuditService,
    private readonly clock: Clock,
  ) {}

  async list(principal: Principal, clipId: string): Promise<NoteListResponse> {
    const clip = await this.clips.findVisible(principal, clipId);
    const notes = await this.uow.repos.notes.listByClip(clip.id);
    const names = await this.authorNames(notes);
    return { notes: notes.map((n) => toNoteDto(n, names.get(n.authorId ?? '') ?? null)) };
  }

  async webVtt(principal: Principal, clipId: string): Promise<{ fileName: string; body: string }> {
    const clip = await this.clips.findVisible(principal, clipId);
    const notes = await this.uow.repos.notes.listByClip(clip.id);
    const names = await this.authorNames(notes);
    const body = notesToWebVtt(
      notes.map((n) => ({
        id: n.id,
        timeMs: n.timeMs,
        text: n.body,
        author: names.get(n.authorId ?? '') ?? null,
      })),
      clip.durationMs,
    );
    const base = clip.originalName.replace(/\.[^.]+$/, '') || 'clip';
    return { fileName: `${base}.notes.vtt`, body };
  }

  async create(principal: Principal, clipId: string, input: CreateNoteBody): Promise<NoteResponse> {
    const clip = await this.analysis.findManageable(principal, clipId);
    checkFrame(clip, input.frameIndex);
    checkTime(clip, input.timeMs);
    const now = this.clock.now();
    const note: Note = {
      id: randomUUID(),
      clipId: clip.id,
      authorId: principal.user.id,
      timeMs: input.timeMs,
      frameIndex: input.frameIndex ?? null,
      body: input.text,
      drawing: input.drawing ?? null,
      createdAt: now,
      updatedAt: now,
    };
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).notes.insert(note);
      await this.audit.record(manager, {
        clubId: clip.clubId,
        actorUserId: principal.user.id,
        action: 'note.create',
        targetType: 'note',
        targetId: note.id,
        details: { clipId: clip.id, timeMs: note.timeMs },
      });
    });
    return { note: toNoteDto(note, principal.user.name) };
  }

  async update(principal: Principal, noteId: string, input: UpdateNoteBody): Promise<NoteResponse> {
    const note = await this.editable(principal, noteId);
    const clip = await this.clips.findVisible(principal, note.clipId);
    checkFrame(clip, input.frameIndex);
    checkTime(clip, input.timeMs);
    const patch: Partial<Note> = { updatedAt: this.clock.now() };
    if (input.timeMs !== undefined) patch.timeMs = input.timeMs;
    if (input.frameIndex !== undefined) patch.frameIndex = input.frameIndex;
    if (input.text !== undefined) patch.body = input.text;
    if (input.drawing !== undefined) patch.drawing = input.drawing;
    await this.uow.repos.notes.update(note.id, patch);
    const updated = { ...note, ...patch };
    const names = await this.authorNames([updated]);
    return { note: toNoteDto(updated, names.get(updated.authorId ?? '') ?? null) };
  }

  async delete(principal: Principal, noteId: string): Promise<void> {
    const note = await this.editable(principal, noteId);
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).notes.delete(note.id);
      await this.audit.record(manager, {
        clubId: principal.clubId,
        actorUserId: principal.user.id,
        action: 'note.delete',
        targetType: 'note',
        targetId: note.id,
        details: { clipId: note.clipId },
      });
    });
  }

  /** The note if the caller wrote it or is the head coach; outside the caller's clips it does not exist. */
  private async editable(principal: Principal, noteId: string): Promise<Note> {
    const note = await this.uow.repos.notes.findById(noteId);
    if (!note) throw notFound('Note');
    await this.clips.findVisible(principal, note.clipId).catch(() => {
      throw notFound('Note');
    });
    if (principal.role !== 'head_coach' && note.authorId !== principal.user.id) {
      throw forbidden('Only the note’s author or the head coach can change or delete it');
    }
    return note;
  }

  private async authorNames(notes: Note[]): Promise<Map<string, string>> {
    const ids = [...new Set(notes.map((n) => n.authorId).filter((id): id is string => !!id))];
    const users = this.uow.repos.users;
    const names = new Map<string, string>();
    for (const id of ids) {
      const user = await users.findById(id);
      if (user) names.set(id, user.name);
    }
    return names;
  }
}
