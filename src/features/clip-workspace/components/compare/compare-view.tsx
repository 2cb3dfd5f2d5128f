import { useCallback, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { Camera, ChevronLeft, ChevronRight, ChevronsLeft, ChevronsRight, Pause, Play } from 'lucide-react';
import { phaseAt, type SyncPlan, type TurnPhases } from '@shared/compare/turn-sync';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { FocusPointDto } from '@shared/schemas/plan.schema';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useUser } from '@/lib/auth';
import { can } from '@/lib/permissions';
import { useKeepCompareStill } from '../../api/compare-api';
import { useClipFrames } from '../../api/get-clip-frames';
import { StageClock, useClock } from '../../lib/stage-clock';
import { AnalysisPanel } from '../analysis';
import { OverlayToolbar } from '../overlays/overlay-toolbar';
import { ClipStage } from '../stage/clip-stage';
import type { OverlayToggles } from '../stage/annotations-context';
import { CompareStills } from './compare-stills';
import { CompareTable } from './compare-table';
import { sideBySide, StillSource, type ComposeFrame } from './still-source';
import { useSyncFollow } from './use-sync-follow';

const COMPARE_OVERLAYS: OverlayToggles = {
  skeleton: true,
  angleArcs: false,
  tiltGauge: true,
  widthBars: true,
};

const modelOf = (clip: ClipDto) => clip.analysis?.model ?? clip.defaultModel;
const fpsOf = (clip: ClipDto) => (clip.fps && clip.fps > 0 ? clip.fps : 30);

function phaseWords(turns: readonly TurnPhases[], frame: number): string {
  const at = phaseAt(turns, frame);
  if (!at) return turns.length ? 'outside the turns' : '';
  const n = at.turnIndex + 1;
  if (at.phase === 'apex') return `apex of turn ${n}`;
  if (at.phase === 'transition') return `transition after turn ${n}`;
  return `in turn ${n}`;
}

function SideCaption({
  label,
  clip,
  clock,
  turns,
}: {
  label: string;
  clip: ClipDto;
  clock: StageClock;
  turns: TurnPhases[];
}) {
  const frame = useClock(clock, (s) => s.frame);
  const where = phaseWords(turns, frame);
  return (
    <p
      className="text-sm text-granite-700"
      aria-live="polite"
      data-testid={`${label.toLowerCase()}-position`}
    >
      <span className="font-semibold text-granite-900">{label}:</span>{' '}
      <Link to={paths.clip.href(clip.id, { frame })} className="text-glacier-700 hover:underline">
        {clip.originalName}
      </Link>{' '}
      · frame {frame}
      {where ? ` · ${where}` : ''}
    </p>
  );
}

interface CompareViewProps {
  left: ClipDto;
  right: ClipDto;
  focusPoints: FocusPointDto[];
}

/** Two clips in two stages, in step by time or by turn, with the focus-point metrics side by side. */
export function CompareView({ left, right, focusPoints }: CompareViewProps) {
  const user = useUser();
  const toast = useToast();
  const [leftClock] = useState(() => new StageClock());
  const [rightClock] = useState(() => new StageClock());
  const leftFrames = useClipFrames(left.id, modelOf(left));
  const rightFrames = useClipFrames(right.id, modelOf(right));
  const leftTurns = useMemo(() => leftFrames.data?.series?.turns ?? [], [leftFrames.data]);
  const rightTurns = useMemo(() => rightFrames.data?.series?.turns ?? [], [rightFrames.data]);
  const canTurnSync = leftTurns.length > 0 && rightTurns.length > 0;

  const [modeChoice, setMode] = useState<'turn' | 'time' | null>(null);
  const mode = modeChoice ?? (canTurnSync ? 'turn' : 'time');
  const [shift, setShift] = useState(0);
  const [starts, setStarts] = useState<[number, number]>([0, 0]);
  const plan = useMemo<SyncPlan>(
    () =>
      mode === 'turn' && canTurnSync
        ? { mode: 'turn', leftTurns, rightTurns, shift, leftFps: fpsOf(left), rightFps: fpsOf(right) }
        : {
            mode: 'time',
            leftStart: starts[0],
            rightStart: starts[1],
            leftFps: fpsOf(left),
            rightFps: fpsOf(right),
          },
    [mode, canTurnSync, leftTurns, rightTurns, shift, starts, left, right],
  );
  useSyncFollow(leftClock, rightClock, plan, right.frameCount ?? 1);

  const playing = useClock(leftClock, (s) => s.playing);
  const leftFrame = useClock(leftClock, (s) => s.frame);
  const apexes = leftTurns.map((t) => t.apexFrame);
  const nextApex = apexes.find((f) => f > leftFrame);
  const previousApex = [...apexes].reverse().find((f) => f < leftFrame);

  const composers = useRef<{ left: ComposeFrame | null; right: ComposeFrame | null }>({
    left: null,
    right: null,
  });
  const registerLeft = useCallback((c: ComposeFrame | null) => (composers.current.left = c), []);
  const registerRight = useCallback((c: ComposeFrame | null) => (composers.current.right = c), []);
  const keep = useKeepCompareStill();
  const keepStill = async () => {
    const { left: composeLeft, right: composeRight } = composers.current;
    try {
      if (!composeLeft || !composeRight) throw new Error('both clips must be on screen first');
      leftClock.pause();
      const png = sideBySide(composeLeft(), composeRight()).toDataURL('image/png');
      const where = phaseWords(leftTurns, leftClock.get().frame);
      await keep.mutateAsync({
        clipAId: left.id,
        clipBId: right.id,
        frameA: leftClock.get().frame,
        frameB: rightClock.get().frame,
        caption: where ? `Both at the ${where}` : '',
        png,
      });
      toast.success('Still kept with these two clips');
    } catch (error) {
      toast.error(`The still was not kept: ${errorMessage(error)}`);
    }
  };

  const missing = [
    { clip: left, frames: leftFrames, label: 'Left' },
    { clip: right, frames: rightFrames, label: 'Right' },
  ].filter((s) => s.frames.data && s.frames.data.frames.length === 0);
  const mayAnalyse = can(user.role, 'clips.analyse');

  return (
    <div className="space-y-5">
      {left.view !== right.view ? (
        <Notice tone="info" title="Two different views">
          The left clip is filmed from the {left.view}, the right from the {right.view}. Metrics of one view
          show why they have no value on the other side.
        </Notice>
      ) : null}
      {missing.length > 0 ? (
        <Notice tone="info" title="Whole-clip analysis needed">
          {missing.map((s) => s.label).join(' and ')} {missing.length === 1 ? 'clip has' : 'clips have'} no
          whole-clip analysis yet: syncing by turn and the table need it.{' '}
          {mayAnalyse ? 'Run it below the stage.' : 'Ask a coach to analyse it.'}
        </Notice>
      ) : null}

      <div className="grid gap-4 lg:grid-cols-2">
        {[
          { side: 'Left', clip: left, clock: leftClock, turns: leftTurns, register: registerLeft },
          { side: 'Right', clip: right, clock: rightClock, turns: rightTurns, register: registerRight },
        ].map(({ side, clip, clock, turns, register }) => (
          <section key={side} aria-label={`${side} clip`} className="min-w-0 space-y-2">
            <SideCaption label={side} clip={clip} clock={clock} turns={turns} />
            <ClipStage clipId={clip.id} readOnly overlays={COMPARE_OVERLAYS} clock={clock}>
              <OverlayToolbar />
              <StillSource register={register} />
              {mayAnalyse && missing.some((s) => s.clip.id === clip.id) ? <AnalysisPanel /> : null}
            </ClipStage>
          </section>
        ))}
      </div>

      <div
        role="group"
        aria-label="Both clips"
        className="flex flex-wrap items-center gap-2 rounded-lg border border-granite-200 bg-white p-3"
      >
        <Button
          variant="secondary"
          size="sm"
          aria-label="Previous apex"
          disabled={previousApex === undefined}
          onClick={() => previousApex !== undefined && leftClock.seekToFrame(previousApex)}
          icon={<ChevronsLeft aria-hidden="true" className="h-4 w-4" />}
        />
        <Button
          variant="secondary"
          size="sm"
          aria-label="Previous frame"
          onClick={() => leftClock.stepFrames(-1)}
          icon={<ChevronLeft aria-hidden="true" className="h-4 w-4" />}
        />
        {playing ? (
          <Button
            size="sm"
            aria-label="Pause both"
            onClick={() => leftClock.pause()}
            icon={<Pause aria-hidden="true" className="h-4 w-4" />}
          />
        ) : (
          <Button
            size="sm"
            aria-label="Play both"
            onClick={() => leftClock.play()}
            icon={<Play aria-hidden="true" className="h-4 w-4" />}
          />
        )}
        <Button
          variant="secondary"
          size="sm"
          aria-label="Next frame"
          onClick={() => leftClock.stepFrames(1)}
          icon={<ChevronRight aria-hidden="true" className="h-4 w-4" />}
        />
        <Button
          variant="secondary"
          size="sm"
          aria-label="Next apex"
          disabled={nextApex === undefined}
          onClick={() => nextApex !== undefined && leftClock.seekToFrame(nextApex)}
          icon={<ChevronsRight aria-hidden="true" className="h-4 w-4" />}
        />
        {apexes.length > 0 ? (
          <div role="group" aria-label="Apex of turn" className="flex flex-wrap gap-1">
            {apexes.map((frame, i) => (
              <Button
                key={frame}
                variant={leftFrame === frame ? 'primary' : 'quiet'}
                size="sm"
                aria-label={`Apex of turn ${i + 1}`}
                onClick={() => leftClock.seekToFrame(frame)}
              >
                {i + 1}
              </Button>
            ))}
          </div>
        ) : null}
        <span className="grow" />
        {can(user.role, 'compare.keepStill') ? (
          <Button
            variant="secondary"
            size="sm"
            busy={keep.isPending}
            onClick={() => void keepStill()}
            icon={<Camera aria-hidden="true" className="h-4 w-4" />}
          >
            Keep a side-by-side still
          </Button>
        ) : null}
      </div>

      <fieldset className="space-y-2 rounded-lg border border-granite-200 bg-white p-3 text-sm">
        <legend className="px-1 font-medium text-granite-900">In step</legend>
        <div className="flex flex-wrap gap-4">
          <label className="flex items-center gap-2">
            <input
              type="radio"
              name="sync-mode"
              checked={mode === 'turn'}
              disabled={!canTurnSync}
              onChange={() => setMode('turn')}
            />
            By turn (apex on apex)
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" name="sync-mode" checked={mode === 'time'} onChange={() => setMode('time')} />
            By time from a start frame
          </label>
        </div>
        {!canTurnSync ? (
          <p className="text-granite-600">
            By turn needs turns in both clips: they are found in analysed front views.
          </p>
        ) : null}
        {mode === 'turn' && canTurnSync ? (
          <div className="flex flex-wrap items-center gap-2">
            <span>
              Left turn 1 is matched with right turn {1 + shift}
              {shift === 0 ? '' : ` (shifted ${shift > 0 ? 'forward' : 'back'} ${Math.abs(shift)})`}.
            </span>
            <Button
              size="sm"
              variant="quiet"
              onClick={() => setShift(shift - 1)}
              disabled={shift <= 1 - rightTurns.length}
            >
              Match an earlier right turn
            </Button>
            <Button
              size="sm"
              variant="quiet"
              onClick={() => setShift(shift + 1)}
              disabled={shift >= rightTurns.length - 1}
            >
              Match a later right turn
            </Button>
          </div>
        ) : null}
        {mode === 'time' ? (
          <div className="flex flex-wrap items-center gap-2">
            <span>
              Start frames: left {starts[0]}, right {starts[1]}.
            </span>
            <Button
              size="sm"
              variant="quiet"
              onClick={() => setStarts([leftClock.get().frame, rightClock.get().frame])}
            >
              Start both here
            </Button>
            <Button size="sm" variant="quiet" onClick={() => setStarts(([a, b]) => [a, Math.max(0, b - 1)])}>
              Right one frame earlier
            </Button>
            <Button size="sm" variant="quiet" onClick={() => setStarts(([a, b]) => [a, b + 1])}>
              Right one frame later
            </Button>
          </div>
        ) : null}
      </fieldset>

      <CompareTable
        left={{ clip: left, clock: leftClock, stored: leftFrames.data }}
        right={{ clip: right, clock: rightClock, stored: rightFrames.data }}
        focusPoints={focusPoints}
      />
      <CompareStills a={left.id} b={right.id} />
      <Notice tone="info" title="2D estimates, not medical advice">
        Both clips are measured from one camera each; a different camera position changes the numbers as much
        as a change in technique can. A coaching aid, not a medical or injury assessment.
      </Notice>
    </div>
  );
}
