import { useEffect, useId, useRef, useState } from 'react';
import { useMutation } from '@tanstack/react-query';
import { Captions, ChevronDown, Download, ImageDown, Sheet } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { useToast } from '@/components/ui/toast';
import { api, errorMessage } from '@/lib/api-client';
import { useExportNotesVtt } from '../../api/export-notes-vtt';
import { formatClipTime } from '../../lib/frame-time';
import { useFrameDrawings } from '../notes/use-frame-drawings';
import { useDrawOverlaysOn } from '../overlays/use-draw-overlays-on';
import { useStage, useStageFrame } from '../stage/stage-context';
import { canvasToPng, composeStill } from './compose-still';
import { saveBlob } from '@/lib/save-file';
import { stillFileName } from './save-file';

/** Still image of the frame with overlays and drawings, the notes as WebVTT captions, the angles as CSV. */
export function ExportMenu() {
  const ws = useStage();
  const drawOverlaysOn = useDrawOverlaysOn();
  // The menu names the frame a still would show.
  const currentFrame = useStageFrame();
  const toast = useToast();
  const { saved, draft } = useFrameDrawings();
  const vtt = useExportNotesVtt(ws.clip.id, saveBlob);
  // Every role may export what it may see: an athlete or guardian gets their own clip's numbers here.
  const csv = useMutation({
    mutationFn: async () => {
      const blob = await api.getBlob('/api/exports/frames.csv', { query: { clipId: ws.clip.id } });
      saveBlob(blob, ws.clip.originalName.replace(/\.[^./\\]+$/, '') + '.frames.csv');
    },
  });
  const [open, setOpen] = useState(false);
  const [savingStill, setSavingStill] = useState(false);
  const menuId = useId();
  const root = useRef<HTMLDivElement | null>(null);

  useEffect(() => {
    if (!open) return;
    const onDown = (event: PointerEvent) => {
      if (!root.current?.contains(event.target as Node)) setOpen(false);
    };
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') setOpen(false);
    };
    document.addEventListener('pointerdown', onDown);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('pointerdown', onDown);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  const saveStill = async () => {
    setOpen(false);
    const video = ws.videoRef.current;
    if (!video) return;
    setSavingStill(true);
    try {
      const canvas = composeStill({
        video,
        drawOverlays: (ctx, scale) => drawOverlaysOn(ctx, (p) => p, scale),
        drawings: draft ? [...saved, draft] : saved,
        caption: `${ws.clip.originalName} · frame ${currentFrame} · ${formatClipTime(
          (currentFrame / ws.fps) * 1000,
        )} · Stanceline, 2D estimate`,
      });
      saveBlob(await canvasToPng(canvas), stillFileName(ws.clip.originalName, currentFrame));
    } catch (error) {
      toast.error(`The still was not saved: ${errorMessage(error)}`);
    } finally {
      setSavingStill(false);
    }
  };

  const saveCsv = () => {
    setOpen(false);
    csv.mutate(undefined, {
      onError: (error) => toast.error(`The numbers were not downloaded: ${errorMessage(error)}`),
    });
  };

  const saveVtt = () => {
    setOpen(false);
    vtt.mutate(ws.clip.originalName, {
      onError: (error) => toast.error(`The captions were not downloaded: ${errorMessage(error)}`),
    });
  };

  return (
    <div ref={root} className="relative">
      <Button
        variant="secondary"
        size="sm"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
        busy={savingStill || vtt.isPending || csv.isPending}
        icon={<Download aria-hidden="true" className="h-4 w-4" />}
        onClick={() => setOpen((v) => !v)}
      >
        Export
        <ChevronDown aria-hidden="true" className="h-3.5 w-3.5" />
      </Button>
      {open ? (
        <div
          id={menuId}
          role="menu"
          aria-label="Export"
          className="absolute right-0 z-30 mt-1 w-72 rounded-md border border-granite-200 bg-white p-1 shadow-lg"
        >
          <button
            type="button"
            role="menuitem"
            onClick={() => void saveStill()}
            className="flex w-full items-start gap-2 rounded px-2 py-1.5 text-left text-sm hover:bg-glacier-50"
          >
            <ImageDown aria-hidden="true" className="mt-0.5 h-4 w-4 text-glacier-700" />
            <span>
              Still image (PNG)
              <span className="block text-xs text-granite-600">
                Frame {currentFrame} at full size with overlays and drawings
              </span>
            </span>
          </button>
          <button
            type="button"
            role="menuitem"
            onClick={saveVtt}
            className="flex w-full items-start gap-2 rounded px-2 py-1.5 text-left text-sm hover:bg-glacier-50"
          >
            <Captions aria-hidden="true" className="mt-0.5 h-4 w-4 text-glacier-700" />
            <span>
              Notes as captions (WebVTT)
              <span className="block text-xs text-granite-600">
                Any video player shows them over the clip
              </span>
            </span>
          </button>
          <button
            type="button"
            role="menuitem"
            onClick={saveCsv}
            className="flex w-full items-start gap-2 rounded px-2 py-1.5 text-left text-sm hover:bg-glacier-50"
          >
            <Sheet aria-hidden="true" className="mt-0.5 h-4 w-4 text-glacier-700" />
            <span>
              Angles of every frame (CSV)
              <span className="block text-xs text-granite-600">
                For a spreadsheet; the Exports page has more, with the codebook
              </span>
            </span>
          </button>
        </div>
      ) : null}
    </div>
  );
}
