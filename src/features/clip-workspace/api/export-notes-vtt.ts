import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The clip's notes as WebVTT cues; the route is authorised, so it goes through the api client as a Blob. */
export function getNotesVtt(clipId: string): Promise<Blob> {
  return api.getBlob(`/api/clips/${encodeURIComponent(clipId)}/notes.vtt`);
}

/** File name for the download: the clip's name without its extension, then ".notes.vtt". */
export function notesVttFileName(originalName: string): string {
  const base =
    originalName
      .replace(/\.[^./\\]+$/, '')
      .replace(/[\\/:*?"<>|]+/g, '-')
      .trim() || 'clip';
  return `${base}.notes.vtt`;
}

export function useExportNotesVtt(clipId: string, save: (blob: Blob, fileName: string) => void) {
  return useMutation({
    mutationFn: async (originalName: string) => {
      const blob = await getNotesVtt(clipId);
      // Players pick captions by MIME type; a server that forgot it still yields a usable file.
      const typed = blob.type.startsWith('text/vtt') ? blob : new Blob([blob], { type: 'text/vtt' });
      save(typed, notesVttFileName(originalName));
      return typed;
    },
  });
}
