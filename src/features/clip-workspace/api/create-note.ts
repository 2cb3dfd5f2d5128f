import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { NoteDrawing, NoteDto } from './get-clip-notes';
import { clipWorkspaceKeys } from './keys';

export interface CreateNoteInput {
  timeMs: number;
  frameIndex: number;
  text: string;
  drawing?: NoteDrawing;
}

export interface NoteResponse {
  note: NoteDto;
}

export function createNote(clipId: string, input: CreateNoteInput): Promise<NoteResponse> {
  return api.post<NoteResponse>(`/api/clips/${encodeURIComponent(clipId)}/notes`, input);
}

export function useCreateNote(clipId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateNoteInput) => createNote(clipId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clipWorkspaceKeys.notes(clipId) }),
  });
}
