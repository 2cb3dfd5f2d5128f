import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NoteResponse, UpdateNoteInput } from '@shared/schemas/note.schema';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export type { UpdateNoteInput };

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
