import { Link } from 'react-router-dom';
import type { SeasonPlanResponse } from '@shared/schemas/plan.schema';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { formatDay } from '@/lib/format';

interface SeasonClipsProps {
  plan: SeasonPlanResponse;
  /** The athlete's first name, or "you". */
  who: string;
  busy: boolean;
  onMarkBaseline(clipId: string | null): void;
}

/** The athlete's clips of the season, oldest first: which is the baseline, and Compare with it. */
export function SeasonClips({ plan, who, busy, onMarkBaseline }: SeasonClipsProps) {
  const season = plan.season!;
  return (
    <section aria-labelledby="season-clips" className="space-y-2">
      <h3 id="season-clips" className="text-sm font-semibold text-granite-900">
        Clips of {who} in {season.name}
      </h3>
      {plan.clips.length === 0 ? (
        <p className="text-sm text-granite-600">
          No clips between {formatDay(season.startsOn)} and {formatDay(season.endsOn)} yet.
        </p>
      ) : (
        <ul className="divide-y divide-granite-100 rounded-lg border border-granite-200 bg-white">
          {plan.clips.map((clip) => {
            const isBaseline = clip.id === plan.baselineClipId;
            return (
              <li
                key={clip.id}
                className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm"
              >
                <div className="flex min-w-0 flex-wrap items-center gap-2">
                  <Link to={paths.clip.href(clip.id)} className="truncate text-glacier-700 hover:underline">
                    {clip.originalName}
                  </Link>
                  <span className="text-granite-600">
                    {formatDay(clip.sessionDate)} · {clip.view} view ·{' '}
                    {clip.analysed
                      ? `${clip.turnCount} ${clip.turnCount === 1 ? 'turn' : 'turns'}`
                      : 'not analysed yet'}
                  </span>
                  {isBaseline ? <Badge tone="warn">Baseline</Badge> : null}
                </div>
                <div className="flex gap-2">
                  {plan.baselineClipId && !isBaseline ? (
                    <Link
                      to={paths.compare.href(plan.baselineClipId, clip.id)}
                      className="text-glacier-700 hover:underline"
                    >
                      Compare with baseline
                    </Link>
                  ) : null}
                  {plan.canEdit ? (
                    <Button
                      size="sm"
                      variant="secondary"
                      busy={busy}
                      aria-label={
                        isBaseline
                          ? `Clear ${clip.originalName} as baseline`
                          : `Mark ${clip.originalName} as baseline`
                      }
                      onClick={() => onMarkBaseline(isBaseline ? null : clip.id)}
                    >
                      {isBaseline ? 'Clear baseline' : 'Mark as baseline'}
                    </Button>
                  ) : null}
                </div>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
