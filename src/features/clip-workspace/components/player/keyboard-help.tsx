import { useEffect, useRef } from 'react';
import { Keyboard } from 'lucide-react';
import { KEY_BINDINGS } from '../../lib/keyboard-map';
import { useStage } from '../stage/stage-context';

interface KeyboardHelpProps {
  open: boolean;
  onOpenChange(open: boolean): void;
}

/** The key list in a popover beside the transport controls. */
export function KeyboardHelp({ open, onOpenChange }: KeyboardHelpProps) {
  const { canEdit } = useStage();
  const boxRef = useRef<HTMLDivElement | null>(null);

  useEffect(() => {
    if (!open) return;
    const onPointer = (event: PointerEvent) => {
      if (!boxRef.current?.contains(event.target as Node)) onOpenChange(false);
    };
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') onOpenChange(false);
    };
    document.addEventListener('pointerdown', onPointer);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('pointerdown', onPointer);
      document.removeEventListener('keydown', onKey);
    };
  }, [open, onOpenChange]);

  return (
    <div ref={boxRef} className="relative">
      <button
        type="button"
        aria-label="Keyboard keys"
        aria-expanded={open}
        aria-controls="workspace-keys"
        onClick={() => onOpenChange(!open)}
        className="inline-flex h-8 w-8 items-center justify-center rounded-md text-granite-600 hover:bg-glacier-50 hover:text-glacier-700 focus-visible:outline-2 focus-visible:outline-glacier-500"
      >
        <Keyboard aria-hidden="true" className="h-4 w-4" />
      </button>
      {open ? (
        <div
          id="workspace-keys"
          role="dialog"
          aria-label="Keyboard keys"
          className="absolute right-0 bottom-full z-30 mb-2 w-72 rounded-lg border border-granite-200 bg-white p-3 shadow-xl"
        >
          <p className="mb-2 text-sm font-semibold text-granite-900">Keys on this page</p>
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1.5 text-sm">
            {KEY_BINDINGS.filter((b) => canEdit || b.command !== 'snow-line').map((binding) => (
              <div key={binding.command} className="contents">
                <dt>
                  <kbd className="rounded border border-granite-200 bg-granite-50 px-1.5 py-0.5 font-mono text-xs text-granite-800">
                    {binding.label}
                  </kbd>
                </dt>
                <dd className="text-granite-600">{binding.description}</dd>
              </div>
            ))}
          </dl>
          <p className="mt-2 text-xs text-granite-400">
            Ctrl + wheel (or a pinch) over the frame zooms at the pointer; drag the zoomed frame to pan.
            {canEdit ? ' On a paused frame, drag a misplaced joint to correct it.' : null}
          </p>
        </div>
      ) : null}
    </div>
  );
}
