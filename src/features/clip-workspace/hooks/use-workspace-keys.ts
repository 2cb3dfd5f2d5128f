import { useEffect } from 'react';
import { useAnnotations } from '../components/stage/annotations-context';
import { PLAYBACK_RATES, useStage } from '../components/stage/stage-context';
import { commandForKey, JUMP_FRAMES } from '../lib/keyboard-map';

import { ZOOM_STEP } from '../components/stage/zoom-controls';

/** Keys the focused control uses itself, so the page leaves them alone. */
function controlOwnsKey(target: EventTarget | null, key: string): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target.isContentEditable) return true;
  // A focused slider already steps with the arrows, Home and End; Space means nothing to it.
  if (target instanceof HTMLInputElement && target.type === 'range') return key !== ' ';
  return ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName);
}

/** Page-wide keys of the workspace (see lib/keyboard-map.ts). */
export function useWorkspaceKeys(options: { toggleHelp(): void }) {
  const stage = useStage();
  const annotations = useAnnotations();
  const { toggleHelp } = options;

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.defaultPrevented || controlOwnsKey(event.target, event.key)) return;
      const command = commandForKey(event);
      if (!command) return;
      // Space on a focused button would click it as well as toggle playback.
      event.preventDefault();
      const ws = { ...stage, ...annotations };
      const rateIndex = PLAYBACK_RATES.indexOf(
        stage.clock.get().playbackRate as (typeof PLAYBACK_RATES)[number],
      );
      switch (command) {
        case 'toggle-play':
          ws.togglePlay();
          break;
        case 'step-back':
          ws.stepFrames(-1);
          break;
        case 'step-forward':
          ws.stepFrames(1);
          break;
        case 'jump-back':
          ws.stepFrames(-JUMP_FRAMES);
          break;
        case 'jump-forward':
          ws.stepFrames(JUMP_FRAMES);
          break;
        case 'first-frame':
          ws.seekToFrame(0);
          break;
        case 'last-frame':
          ws.seekToFrame(ws.frameCount - 1);
          break;
        case 'slower':
          ws.setPlaybackRate(PLAYBACK_RATES[Math.max(0, rateIndex - 1)] ?? PLAYBACK_RATES[0]);
          break;
        case 'faster':
          ws.setPlaybackRate(
            PLAYBACK_RATES[Math.min(PLAYBACK_RATES.length - 1, rateIndex + 1)] ?? PLAYBACK_RATES[0],
          );
          break;
        case 'zoom-in':
          ws.zoomAt(ws.viewTransform.zoom * ZOOM_STEP);
          break;
        case 'zoom-out':
          ws.zoomAt(ws.viewTransform.zoom / ZOOM_STEP);
          break;
        case 'zoom-fit':
          ws.resetZoom();
          break;
        case 'snow-line':
          if (ws.canEdit) ws.setSnowLineEditing(!ws.snowLineEditing);
          break;
        case 'help':
          toggleHelp();
          break;
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [stage, annotations, toggleHelp]);
}
