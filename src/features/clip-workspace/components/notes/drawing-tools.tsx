import { Eraser, MoveUpRight, PenLine, Triangle, Undo2 } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { cn } from '@/lib/format';
import { DRAWING_COLORS } from './draw-drawing';
import { drawingDraft, useDrawingDraft } from './drawing-draft';
import { isDrawingEmpty, type DrawingTool } from './drawing-geometry';

const TOOLS: { tool: DrawingTool; label: string; icon: typeof PenLine; hint: string }[] = [
  { tool: 'freehand', label: 'Freehand', icon: PenLine, hint: 'Drag on the frame to draw a line.' },
  { tool: 'arrow', label: 'Arrow', icon: MoveUpRight, hint: 'Drag from the tail to the tip of the arrow.' },
  {
    tool: 'angle',
    label: 'Angle',
    icon: Triangle,
    hint: 'Drag the first arm from its end to the vertex, then click where the second arm ends. Esc drops it.',
  },
];

/** Tool, colour, Undo and Clear for the draft note's drawing. */
export function DrawingTools() {
  const draft = useDrawingDraft();
  const current = TOOLS.find((t) => t.tool === draft.tool) ?? TOOLS[0];
  const empty = isDrawingEmpty(draft.drawing);

  return (
    <div className="space-y-2 rounded-md border border-glacier-200 bg-glacier-50 p-2.5">
      <div className="flex flex-wrap items-center gap-1" role="radiogroup" aria-label="Drawing tool">
        {TOOLS.map(({ tool, label, icon: Icon }) => (
          <button
            key={tool}
            type="button"
            role="radio"
            aria-checked={draft.tool === tool}
            onClick={() => drawingDraft.setTool(tool)}
            className={cn(
              'inline-flex h-8 items-center gap-1.5 rounded-md border px-2 text-sm',
              draft.tool === tool
                ? 'border-glacier-700 bg-glacier-700 text-white'
                : 'border-granite-200 bg-white text-granite-800 hover:border-glacier-300',
            )}
          >
            <Icon aria-hidden="true" className="h-4 w-4" />
            {label}
          </button>
        ))}
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <div className="flex items-center gap-1" role="radiogroup" aria-label="Line colour">
          {DRAWING_COLORS.map((c) => (
            <button
              key={c.value}
              type="button"
              role="radio"
              aria-checked={draft.color === c.value}
              aria-label={c.name}
              title={c.name}
              disabled={draft.tool === 'angle'}
              onClick={() => drawingDraft.setColor(c.value)}
              className={cn(
                'h-6 w-6 rounded-full border-2 disabled:opacity-40',
                draft.color === c.value ? 'border-glacier-900 ring-2 ring-glacier-300' : 'border-granite-200',
              )}
              style={{ backgroundColor: c.value }}
            />
          ))}
        </div>
        <span className="ml-auto flex gap-1">
          <Button
            variant="quiet"
            size="sm"
            icon={<Undo2 aria-hidden="true" className="h-4 w-4" />}
            disabled={empty}
            onClick={() => drawingDraft.undo()}
          >
            Undo
          </Button>
          <Button
            variant="quiet"
            size="sm"
            icon={<Eraser aria-hidden="true" className="h-4 w-4" />}
            disabled={empty}
            onClick={() => drawingDraft.clear()}
          >
            Clear drawing
          </Button>
        </span>
      </div>
      <p className="text-xs text-granite-600">{current.hint}</p>
      {draft.drawing.angles.length > 0 ? (
        <p className="text-xs text-granite-700">
          Measured:{' '}
          {draft.drawing.angles.map((a, i) => (
            <span key={i} className="mr-2 font-mono tabular-nums">
              {a.degrees.toFixed(1)}°
            </span>
          ))}
        </p>
      ) : null}
    </div>
  );
}
