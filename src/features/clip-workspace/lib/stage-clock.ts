import { ExternalStore, useStoreSlice } from './external-store';

/** What the video of one stage is doing now. Changes up to once per displayed video frame. */
export interface ClockState {
  /** The frame actually displayed (from requestVideoFrameCallback). */
  frame: number;
  timeMs: number;
  playing: boolean;
  /** The video has a decoded frame to show (readyState >= HAVE_CURRENT_DATA). */
  mediaReady: boolean;
  playbackRate: number;
}

/** Commands a stage answers; the stage attaches them to its clock while it is mounted. */
export interface ClockControls {
  play(): void;
  pause(): void;
  seekToFrame(frameIndex: number): void;
  stepFrames(delta: number): void;
  setPlaybackRate(rate: number): void;
}

const INITIAL: ClockState = { frame: 0, timeMs: 0, playing: false, mediaReady: false, playbackRate: 1 };

/**
 * The playback clock of one stage, kept outside React state: the video writes to it on every frame,
 * and each component reads only the slice it shows (useClock with a selector), so playing a clip
 * re-renders what shows the frame and nothing else. A page that owns the clock (Compare keeps two in
 * step) can read it and command the stage through it.
 */
export class StageClock extends ExternalStore<ClockState> {
  private controls: ClockControls | null = null;

  constructor() {
    super(INITIAL);
  }

  /** The stage's commands; returns the detach function for its cleanup. */
  attach(controls: ClockControls): () => void {
    this.controls = controls;
    return () => {
      if (this.controls === controls) this.controls = null;
    };
  }

  play(): void {
    this.controls?.play();
  }
  pause(): void {
    this.controls?.pause();
  }
  seekToFrame(frameIndex: number): void {
    this.controls?.seekToFrame(frameIndex);
  }
  stepFrames(delta: number): void {
    this.controls?.stepFrames(delta);
  }
  setPlaybackRate(rate: number): void {
    this.controls?.setPlaybackRate(rate);
  }
}

/**
 * One slice of a clock; the component re-renders only when the selected value changes (compared with
 * Object.is), e.g. `useClock(clock, (s) => s.frame === noteFrame)` flips twice per pass, not per frame.
 */
export function useClock<T>(clock: StageClock, select: (state: ClockState) => T): T {
  return useStoreSlice(clock, select);
}
