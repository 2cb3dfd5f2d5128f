import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { NoteResponse } from './create-note';
import type { NoteDrawing } from './get-clip-notes';
import { clipWorkspaceKeys } from './keys';

export interface UpdateNoteInput {
  text?: string;
  drawing?: NoteDrawing | null;
}

export function updateNote(noteId: string, input: UpdateNoteInput): Promise<NoteResponse> {
  return api.patch<NoteResponse>(`/api/notes/${encodeURIComponent(noteId)}`, input);
}

export function useUpdateNote(clipId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ noteId, input }: { noteId: string; input: UpdateNoteInput }) => updateNote(noteId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clipWorkspaceKeys.notes(clipId) }),
  });
}
