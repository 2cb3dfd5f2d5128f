/** How long each note stays on screen as a caption. */
export const NOTE_CUE_MS = 4000;

export interface VttNote {
  id: string;
  timeMs: number;
  text: string;
  author: string | null;
}

/** hh:mm:ss.ttt, the WebVTT timestamp with hours always present. */
export function vttTimestamp(ms: number): string {
  const total = Math.max(0, Math.round(ms));
  const h = Math.floor(total / 3_600_000);
  const m = Math.floor((total % 3_600_000) / 60_000);
  const s = Math.floor((total % 60_000) / 1000);
  const t = total % 1000;
  const pad = (n: number, w: number) => String(n).padStart(w, '0');
  return `${pad(h, 2)}:${pad(m, 2)}:${pad(s, 2)}.${pad(t, 3)}`;
}

/**
 * Cue text per the WebVTT spec: "&" and "<" must be escaped (">" too, so "-->" can never appear),
 * and a blank line would end the cue, so empty lines are dropped.
 */
export function escapeCueText(text: string): string {
  return text
    .replace(/\r\n?/g, '\n')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .split('\n')
    .map((line) => line.replace(/[\t ]+$/g, ''))
    .filter((line) => line.trim().length > 0)
    .join('\n');
}

/** Voice span names the author, so a player can show who wrote the note. */
function cuePayload(note: VttNote): string {
  const text = escapeCueText(note.text);
  if (!note.author) return text;
  return `<v ${escapeCueText(note.author).replace(/\n/g, ' ')}>${text}`;
}

/**
 * Every note a cue from its time for NOTE_CUE_MS (ending at the clip's end when that is known and
 * later than the note), in time order, identified by the note's id.
 */
export function notesToWebVtt(notes: VttNote[], clipDurationMs: number | null): string {
  const lines = ['WEBVTT', ''];
  for (const note of [...notes].sort((a, b) => a.timeMs - b.timeMs)) {
    let end = note.timeMs + NOTE_CUE_MS;
    if (clipDurationMs !== null && clipDurationMs > note.timeMs) end = Math.min(end, clipDurationMs);
    lines.push(note.id, `${vttTimestamp(note.timeMs)} --> ${vttTimestamp(end)}`, cuePayload(note), '');
  }
  return lines.join('\n');
}
