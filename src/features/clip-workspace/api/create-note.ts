import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateNoteInput, NoteResponse } from '@shared/schemas/note.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export type { CreateNoteInput, NoteResponse };

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
