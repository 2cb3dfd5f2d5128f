// The workspace's own key scheme. One table drives both the handler and the help popover, so the
// list a coach reads is the list that works.

export type WorkspaceCommand =
  | 'toggle-play'
  | 'step-back'
  | 'step-forward'
  | 'jump-back'
  | 'jump-forward'
  | 'first-frame'
  | 'last-frame'
  | 'slower'
  | 'faster'
  | 'zoom-in'
  | 'zoom-out'
  | 'zoom-fit'
  | 'snow-line'
  | 'help';

export interface KeyBinding {
  command: WorkspaceCommand;
  /** KeyboardEvent.key values that trigger it. */
  keys: readonly string[];
  shift?: boolean;
  /** How the help popover shows the keys. */
  label: string;
  description: string;
}

/** Frames skipped by a shifted arrow. */
export const JUMP_FRAMES = 10;

export const KEY_BINDINGS: readonly KeyBinding[] = [
  { command: 'toggle-play', keys: [' '], label: 'Space', description: 'Play or pause' },
  { command: 'step-back', keys: ['ArrowLeft'], label: '←', description: 'One frame back' },
  { command: 'step-forward', keys: ['ArrowRight'], label: '→', description: 'One frame forward' },
  {
    command: 'jump-back',
    keys: ['ArrowLeft'],
    shift: true,
    label: 'Shift + ←',
    description: `${JUMP_FRAMES} frames back`,
  },
  {
    command: 'jump-forward',
    keys: ['ArrowRight'],
    shift: true,
    label: 'Shift + →',
    description: `${JUMP_FRAMES} frames forward`,
  },
  { command: 'first-frame', keys: ['Home'], label: 'Home', description: 'First frame' },
  { command: 'last-frame', keys: ['End'], label: 'End', description: 'Last frame' },
  { command: 'slower', keys: ['['], label: '[', description: 'Slower playback' },
  { command: 'faster', keys: [']'], label: ']', description: 'Faster playback' },
  { command: 'zoom-in', keys: ['+', '='], label: '+', description: 'Zoom in on the frame' },
  { command: 'zoom-out', keys: ['-', '_'], label: '−', description: 'Zoom out' },
  { command: 'zoom-fit', keys: ['0'], label: '0', description: 'Whole frame' },
  { command: 'snow-line', keys: ['n', 'N'], label: 'N', description: 'Edit the snow line' },
  { command: 'help', keys: ['?'], label: '?', description: 'Show these keys' },
];

export interface KeyLike {
  key: string;
  shiftKey: boolean;
  ctrlKey: boolean;
  metaKey: boolean;
  altKey: boolean;
}

/** The command a key press means, or null. Shift matters only for bindings that ask for it. */
export function commandForKey(event: KeyLike): WorkspaceCommand | null {
  if (event.ctrlKey || event.metaKey || event.altKey) return null;
  const shifted = KEY_BINDINGS.find((b) => b.shift && event.shiftKey && b.keys.includes(event.key));
  if (shifted) return shifted.command;
  const plain = KEY_BINDINGS.find((b) => !b.shift && b.keys.includes(event.key));
  return plain?.command ?? null;
}
