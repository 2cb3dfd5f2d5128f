import { ACCEPTED_CLIP_EXTENSIONS, MAX_CLIP_BYTES_DEFAULT } from '@shared/schemas/clip.schema';
import { formatBytes } from '@/lib/format';

export const ACCEPT_ATTRIBUTE = ['video/*', ...ACCEPTED_CLIP_EXTENSIONS].join(',');

const FORMAT_NAMES: Record<(typeof ACCEPTED_CLIP_EXTENSIONS)[number], string> = {
  '.mp4': 'MP4',
  '.mov': 'MOV',
  '.m4v': 'M4V',
  '.webm': 'WebM',
  '.avi': 'AVI',
  '.mkv': 'MKV',
};
const names = ACCEPTED_CLIP_EXTENSIONS.map((ext) => FORMAT_NAMES[ext]);
/** "MP4, MOV, M4V, WebM, AVI or MKV" */
export const ACCEPTED_FORMATS_TEXT = `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}`;

function extensionOf(name: string): string {
  const dot = name.lastIndexOf('.');
  return dot < 0 ? '' : name.slice(dot).toLowerCase();
}

/**
 * A first check in the browser so an obvious mistake costs no upload time; the server sniffs the content
 * again, because a name says nothing about what is inside.
 * Returns null when the file may be sent, else a message that says what is wrong.
 */
export function checkClipFile(
  file: Pick<File, 'name' | 'size' | 'type'>,
  maxBytes: number = MAX_CLIP_BYTES_DEFAULT,
): string | null {
  const extension = extensionOf(file.name);
  const knownExtension = (ACCEPTED_CLIP_EXTENSIONS as readonly string[]).includes(extension);
  const mediaKind = file.type.split('/')[0];
  if (!knownExtension || (file.type && mediaKind !== 'video' && file.type !== 'application/octet-stream')) {
    return `${file.name} is not a video clip. Stanceline takes ${ACCEPTED_FORMATS_TEXT} files.`;
  }
  if (file.size === 0) return `${file.name} is empty (0 bytes). Copy the clip from the camera again.`;
  if (file.size > maxBytes) {
    return `${file.name} is ${formatBytes(file.size)}, over the ${formatBytes(maxBytes)} limit. Trim the clip first.`;
  }
  return null;
}
