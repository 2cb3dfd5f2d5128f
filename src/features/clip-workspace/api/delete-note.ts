import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { clipWorkspaceKeys } from './keys';

export function deleteNote(noteId: string): Promise<void> {
  return api.delete<void>(`/api/notes/${encodeURIComponent(noteId)}`);
}

export function useDeleteNote(clipId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (noteId: string) => deleteNote(noteId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clipWorkspaceKeys.notes(clipId) }),
  });
}
