import type { ToleranceBandDto } from '@shared/schemas/tolerance.schema';
import {
  BAND_METRICS,
  BAND_METRIC_KEYS,
  formatBandRange,
  formatUnitValue,
  outsideMeaning,
  type BandMetricKey,
} from '@shared/tolerance';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { formatDay } from '@/lib/format';

interface BandTableProps {
  ageGroupName: string;
  bands: ToleranceBandDto[];
  editable: boolean;
  busyMetric: BandMetricKey | null;
  onEdit(metric: BandMetricKey): void;
  onReset(metric: BandMetricKey): void;
}

const GROUPS: { per: 'frame' | 'turn'; title: string }[] = [
  { per: 'frame', title: 'Every frame' },
  { per: 'turn', title: 'Once per turn' },
];

/** Every band metric of one age group: limits, target, what "outside" means, and where it came from. */
export function BandTable({ ageGroupName, bands, editable, busyMetric, onEdit, onReset }: BandTableProps) {
  const byMetric = new Map(bands.map((b) => [b.metric, b]));
  return (
    <div className="overflow-x-auto rounded-lg border border-granite-200 bg-white">
      <table className="w-full text-sm">
        <caption className="sr-only">Tolerance bands of {ageGroupName}</caption>
        <thead className="border-b border-granite-200 bg-granite-50 text-left text-xs text-granite-600">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">
              Metric
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Band
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Target
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Flagged when
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Set by
            </th>
            {editable ? (
              <th scope="col" className="px-3 py-2 font-medium">
                <span className="sr-only">Actions</span>
              </th>
            ) : null}
          </tr>
        </thead>
        {GROUPS.map((group) => (
          <tbody key={group.per}>
            <tr>
              <th
                scope="colgroup"
                colSpan={editable ? 6 : 5}
                className="bg-white px-3 pt-3 pb-1 text-left text-xs font-semibold tracking-wide text-granite-600 uppercase"
              >
                {group.title}
              </th>
            </tr>
            {BAND_METRIC_KEYS.filter((key) => BAND_METRICS[key].per === group.per).map((key) => {
              const info = BAND_METRICS[key];
              const band = byMetric.get(key) ?? null;
              const limited = band !== null && (band.min !== null || band.max !== null);
              return (
                <tr key={key} data-metric={key} className="border-t border-granite-100 align-top">
                  <th scope="row" className="px-3 py-2 text-left font-medium text-granite-900">
                    {info.label}
                    <span className="block text-xs font-normal text-granite-400">
                      {info.view === 'both' ? 'front or side view' : `${info.view} view`}
                    </span>
                  </th>
                  <td className="px-3 py-2 font-mono whitespace-nowrap tabular-nums">
                    {limited ? (
                      formatBandRange(band, info.unit)
                    ) : (
                      <span className="text-granite-400">none</span>
                    )}
                  </td>
                  <td className="px-3 py-2 font-mono whitespace-nowrap tabular-nums">
                    {band?.target !== null && band?.target !== undefined
                      ? formatUnitValue(band.target, info.unit)
                      : '—'}
                  </td>
                  <td className="px-3 py-2 text-granite-700">
                    {band?.meaning ?? outsideMeaning(key, null, null)}
                  </td>
                  <td className="px-3 py-2 text-xs whitespace-nowrap text-granite-600">
                    {band === null ? (
                      '—'
                    ) : band.source === 'common practice' ? (
                      <Badge tone="info">common practice</Badge>
                    ) : (
                      <>
                        {band.updatedBy ?? 'a coach'}
                        <span className="block">
                          {formatDay(band.updatedAt.slice(0, 10))} · v{band.version}
                        </span>
                      </>
                    )}
                  </td>
                  {editable ? (
                    <td className="px-3 py-2 whitespace-nowrap">
                      <div className="flex gap-1">
                        <Button
                          size="sm"
                          variant="secondary"
                          onClick={() => onEdit(key)}
                          aria-label={`Edit ${info.label} for ${ageGroupName}`}
                        >
                          Edit
                        </Button>
                        {band && band.source === 'club' ? (
                          <Button
                            size="sm"
                            variant="quiet"
                            busy={busyMetric === key}
                            onClick={() => onReset(key)}
                            aria-label={`Reset ${info.label} for ${ageGroupName} to the default`}
                          >
                            Reset to default
                          </Button>
                        ) : null}
                      </div>
                    </td>
                  ) : null}
                </tr>
              );
            })}
          </tbody>
        ))}
      </table>
    </div>
  );
}
