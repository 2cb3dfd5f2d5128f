import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

/** Video pixel space (x right, y down) of the clip's frames. */
export type NotePoint = [number, number];

export interface NoteDrawing {
  strokes: { points: NotePoint[]; color: string }[];
  arrows: { from: NotePoint; to: NotePoint; color: string }[];
  angles: { a: NotePoint; vertex: NotePoint; b: NotePoint; degrees: number }[];
}

export interface NoteDto {
  id: string;
  timeMs: number;
  frameIndex: number;
  text: string;
  drawing: NoteDrawing | null;
  author: { id: string; name: string };
  createdAt: string;
}

export interface NoteListResponse {
  notes: NoteDto[];
}

export function getClipNotes(clipId: string): Promise<NoteListResponse> {
  return api.get<NoteListResponse>(`/api/clips/${encodeURIComponent(clipId)}/notes`);
}

export const clipNotesQueryOptions = (clipId: string) =>
  queryOptions({
    queryKey: clipWorkspaceKeys.notes(clipId),
    queryFn: () => getClipNotes(clipId),
    select: (data) =>
      [...data.notes].sort((a, b) => a.timeMs - b.timeMs || a.createdAt.localeCompare(b.createdAt)),
  });

export function useClipNotes(clipId: string) {
  return useQuery(clipNotesQueryOptions(clipId));
}
