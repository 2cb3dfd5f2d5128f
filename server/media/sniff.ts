import { fileTypeFromFile } from 'file-type';

/** Containers we accept, by the type file-type reads from the first bytes (never by the name). */
const VIDEO_CONTAINERS: Record<string, string> = {
  mp4: 'video/mp4',
  m4v: 'video/mp4',
  mov: 'video/quicktime',
  qt: 'video/quicktime',
  webm: 'video/webm',
  mkv: 'video/x-matroska',
  avi: 'video/x-msvideo',
};

export const ACCEPTED_CONTAINER_LABEL = 'MP4, MOV, WebM, MKV or AVI';

export type SniffResult = { ok: true; ext: string; mime: string } | { ok: false; detected: string | null };

export async function sniffVideoContainer(filePath: string): Promise<SniffResult> {
  const type = await fileTypeFromFile(filePath);
  if (!type) return { ok: false, detected: null };
  const mime = VIDEO_CONTAINERS[type.ext];
  return mime ? { ok: true, ext: type.ext, mime } : { ok: false, detected: type.mime };
}
