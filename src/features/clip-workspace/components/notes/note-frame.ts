import type { NoteDto } from '../../api/get-clip-notes';
import { frameAtMs } from '../../lib/frame-time';

/** The frame a note is pinned to; notes saved with a time only fall on the frame shown at that time. */
export function noteFrame(
  note: Pick<NoteDto, 'frameIndex' | 'timeMs'>,
  fps: number,
  frameCount: number,
): number {
  return note.frameIndex ?? frameAtMs(note.timeMs, fps, frameCount);
}
