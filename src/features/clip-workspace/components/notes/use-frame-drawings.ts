import { useMemo } from 'react';
import { useClipNotes } from '../../api/get-clip-notes';
import { useStage, useStageFrame } from '../stage/stage-context';
import { useDrawingDraft } from './drawing-draft';
import { isDrawingEmpty, type Drawing } from './drawing-geometry';
import { noteFrame } from './note-frame';

/** Drawings to show on the frame on screen: saved notes pinned to it, and the draft when it is there. */
export function useFrameDrawings(): { saved: Drawing[]; draft: Drawing | null } {
  const { clip, fps, frameCount } = useStage();
  const currentFrame = useStageFrame();
  const notes = useClipNotes(clip.id);
  const draft = useDrawingDraft();
  const saved = useMemo(
    () =>
      (notes.data ?? [])
        .filter((n) => noteFrame(n, fps, frameCount) === currentFrame && !isDrawingEmpty(n.drawing))
        .map((n) => n.drawing as Drawing),
    [notes.data, currentFrame, fps, frameCount],
  );
  const onDraftFrame = draft.frameIndex === null || draft.frameIndex === currentFrame;
  return { saved, draft: onDraftFrame && !isDrawingEmpty(draft.drawing) ? draft.drawing : null };
}
