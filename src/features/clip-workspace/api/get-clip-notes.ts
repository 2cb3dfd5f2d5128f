import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NoteListResponse } from '@shared/schemas/note.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export type { NoteDrawing, NoteDto, NoteListResponse } from '@shared/schemas/note.schema';

/** Video pixel space (x right, y down) of the clip's frames. */
export type NotePoint = [number, number];

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
