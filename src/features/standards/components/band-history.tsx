import type { ToleranceBandChangeDto } from '@shared/schemas/tolerance.schema';
import { BAND_METRICS, formatBandRange } from '@shared/tolerance';
import { formatDateTime } from '@/lib/format';

type Values = NonNullable<ToleranceBandChangeDto['before']>;

function describe(
  values: Values | null,
  unit: (typeof BAND_METRICS)[keyof typeof BAND_METRICS]['unit'],
): string {
  if (!values) return 'no band';
  const range = values.min === null && values.max === null ? 'no limits' : formatBandRange(values, unit);
  return values.source === 'common practice' ? `${range} (common practice)` : range;
}

/** Every change of the bands shown, newest first: who, when, and the band before and after. */
export function BandHistory({ changes }: { changes: ToleranceBandChangeDto[] }) {
  if (changes.length === 0)
    return (
      <p className="text-sm text-granite-600">
        No band has been changed yet: every band is the common-practice default.
      </p>
    );
  return (
    <ol className="divide-y divide-granite-100 text-sm" aria-label="Band changes">
      {changes.map((change) => {
        const info = BAND_METRICS[change.metric];
        return (
          <li key={change.id} className="py-2">
            <p className="text-granite-900">
              <span className="font-medium">
                {change.ageGroupName} {info.label.toLowerCase()}
              </span>
              : {describe(change.before, info.unit)} → {describe(change.after, info.unit)}
              {change.action === 'reset' ? ' (reset to default)' : ''}
            </p>
            <p className="text-xs text-granite-600">
              {change.changedBy ?? 'A former member'} · {formatDateTime(change.changedAt)} · version{' '}
              {change.version}
            </p>
          </li>
        );
      })}
    </ol>
  );
}
