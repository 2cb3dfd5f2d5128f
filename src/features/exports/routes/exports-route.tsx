import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Download } from 'lucide-react';
import { EXPORT_KINDS, type ExportKind } from '@shared/exports/codebook';
import { METRIC_DEFINITIONS, METRIC_KEYS, type MetricKey } from '@shared/metrics';
import { Button } from '@/components/ui/button';
import { FormError, SelectField, TextField } from '@/components/ui/field';
import { Card, PageHeader } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner, Spinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { cn, formatBytes } from '@/lib/format';
import { useDebouncedValue } from '@/lib/use-debounced-value';
import {
  useCodebook,
  useDownloadExport,
  useExportChoices,
  useExportCount,
  type ExportFilters,
} from '../api/exports-api';
import { CodebookTable } from '../components/codebook-table';

const KIND_TEXT: Record<ExportKind, { title: string; text: string }> = {
  frames: {
    title: 'Frames',
    text: 'One row per analysed frame: every chosen metric with its unit and confidence.',
  },
  keypoints: {
    title: 'Keypoints',
    text: 'One row per keypoint of every frame (long format), with the frame size.',
  },
  turns: {
    title: 'Turns',
    text: 'One row per turn: direction, timing, apex values, transition rise, flags.',
  },
};

const count = (n: number) => n.toLocaleString('en-GB');

export function ExportsRoute() {
  const toast = useToast();
  const [kind, setKind] = useState<ExportKind>('frames');
  const [filters, setFilters] = useState<ExportFilters>({ values: 'raw' });
  const choices = useExportChoices();
  const codebook = useCodebook();
  const settled = useDebouncedValue(filters, 300);
  const datesWrong = Boolean(filters.from && filters.to && filters.from > filters.to);
  const metricsEmpty = kind === 'frames' && filters.metrics?.length === 0;
  const sizing = useExportCount(kind, settled, !datesWrong && !metricsEmpty);
  const download = useDownloadExport();
  const set = (patch: Partial<ExportFilters>) => setFilters((f) => ({ ...f, ...patch }));
  const chosen = new Set(filters.metrics ?? METRIC_KEYS);
  const toggleMetric = (key: MetricKey) => {
    const next = new Set(chosen);
    if (next.has(key)) next.delete(key);
    else next.add(key);
    set({ metrics: next.size === METRIC_KEYS.length ? undefined : METRIC_KEYS.filter((k) => next.has(k)) });
  };
  const athletes = (choices.data?.athletes ?? []).filter(
    (a) => !filters.ageGroupId || a.ageGroup.id === filters.ageGroupId,
  );

  if (choices.isPending) return <PageSpinner label="Loading what you can export" />;
  if (choices.isError)
    return (
      <QueryError error={choices.error} what="the export choices" retry={() => void choices.refetch()} />
    );

  return (
    <>
      <PageHeader
        title="Exports"
        subtitle="Per-frame numbers for spreadsheets and statistics tools: CSV, UTF-8, one header row, every column in the codebook."
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="space-y-5">
          <Card title="What to export">
            <fieldset>
              <legend className="sr-only">Export</legend>
              <div className="grid gap-2 sm:grid-cols-3">
                {EXPORT_KINDS.map((k) => (
                  <label
                    key={k}
                    className={cn(
                      'cursor-pointer rounded-md border p-3 text-sm',
                      k === kind
                        ? 'border-glacier-700 bg-glacier-50'
                        : 'border-granite-200 hover:border-glacier-300',
                    )}
                  >
                    <input
                      type="radio"
                      name="kind"
                      value={k}
                      checked={k === kind}
                      onChange={() => setKind(k)}
                      className="mr-2"
                    />
                    <span className="font-medium text-granite-900">{KIND_TEXT[k].title}</span>
                    <span className="mt-1 block text-xs text-granite-600">{KIND_TEXT[k].text}</span>
                  </label>
                ))}
              </div>
            </fieldset>
          </Card>
          <Card title="Which clips">
            <div className="grid gap-3 sm:grid-cols-2">
              <SelectField
                label="Age group"
                value={filters.ageGroupId ?? ''}
                onChange={(e) => set({ ageGroupId: e.target.value || undefined, athleteId: undefined })}
              >
                <option value="">Every group you may see</option>
                {choices.data.ageGroups.map((g) => (
                  <option key={g.id} value={g.id}>
                    {g.name}
                  </option>
                ))}
              </SelectField>
              <SelectField
                label="Athlete"
                value={filters.athleteId ?? ''}
                onChange={(e) => set({ athleteId: e.target.value || undefined })}
              >
                <option value="">Every athlete</option>
                {athletes.map((a) => (
                  <option key={a.id} value={a.id}>
                    {a.firstName} {a.lastName}
                  </option>
                ))}
              </SelectField>
              <SelectField
                label="Training session"
                value={filters.sessionId ?? ''}
                onChange={(e) => set({ sessionId: e.target.value || undefined })}
              >
                <option value="">Every session</option>
                {choices.data.sessions.map((s) => (
                  <option key={s.id} value={s.id}>
                    {s.date} · {s.venue}
                  </option>
                ))}
              </SelectField>
              <SelectField
                label="Camera view"
                value={filters.view ?? ''}
                onChange={(e) => set({ view: (e.target.value || undefined) as ExportFilters['view'] })}
              >
                <option value="">Front and side</option>
                <option value="front">Front</option>
                <option value="side">Side</option>
              </SelectField>
              <TextField
                label="From (session day)"
                type="date"
                value={filters.from ?? ''}
                onChange={(e) => set({ from: e.target.value || undefined })}
              />
              <TextField
                label="To (session day)"
                type="date"
                value={filters.to ?? ''}
                error={datesWrong ? 'The end is before the start' : undefined}
                onChange={(e) => set({ to: e.target.value || undefined })}
              />
            </div>
          </Card>
          {kind === 'frames' ? (
            <Card title="Metrics and values">
              <SelectField
                label="Values"
                value={filters.values}
                onChange={(e) => set({ values: e.target.value as ExportFilters['values'] })}
                hint="Smoothed: the clip's filtered series, as the curves show it (see the codebook)."
              >
                <option value="raw">Each frame's own values</option>
                <option value="smoothed">Smoothed series</option>
              </SelectField>
              <fieldset className="mt-3">
                <legend className="mb-1 text-sm font-medium text-granite-800">
                  Metrics{' '}
                  <span className="font-normal text-granite-600">
                    ({chosen.size} of {METRIC_KEYS.length})
                  </span>
                </legend>
                <div className="grid gap-x-4 gap-y-1 sm:grid-cols-2">
                  {METRIC_KEYS.map((key) => (
                    <label key={key} className="flex items-center gap-2 text-sm text-granite-800">
                      <input type="checkbox" checked={chosen.has(key)} onChange={() => toggleMetric(key)} />
                      {METRIC_DEFINITIONS[key].label}
                    </label>
                  ))}
                </div>
                {metricsEmpty ? <FormError message="Choose at least one metric" /> : null}
              </fieldset>
            </Card>
          ) : null}
          <div role="status" className="rounded-lg border border-granite-200 bg-white p-4">
            {sizing.isError ? <QueryError error={sizing.error} what="the row count" /> : null}
            {sizing.data && !datesWrong && !metricsEmpty ? (
              <p className={cn('text-sm text-granite-800', sizing.isFetching && 'opacity-60')}>
                <span className="font-mono tabular-nums">{count(sizing.data.rows)}</span> rows from{' '}
                <span className="font-mono tabular-nums">{count(sizing.data.clips)}</span>{' '}
                {sizing.data.clips === 1 ? 'clip' : 'clips'}, about {formatBytes(sizing.data.approxBytes)};{' '}
                {sizing.data.columns.length} columns.
              </p>
            ) : sizing.isPending && !datesWrong && !metricsEmpty ? (
              <Spinner size="sm" label="Counting rows" />
            ) : null}
            <div className="mt-3 flex flex-wrap items-center gap-3">
              <Button
                icon={<Download aria-hidden="true" className="h-4 w-4" />}
                busy={download.isPending}
                disabled={datesWrong || metricsEmpty || sizing.data?.rows === 0}
                onClick={() =>
                  download.mutate(
                    { kind, filters },
                    {
                      onSuccess: (bytes) =>
                        toast.success(`Saved ${KIND_TEXT[kind].title.toLowerCase()}: ${formatBytes(bytes)}.`),
                    },
                  )
                }
              >
                Download CSV
              </Button>
              {sizing.data?.rows === 0 ? (
                <span className="text-sm text-granite-600">No analysed frames match: widen the filters.</span>
              ) : null}
            </div>
            <FormError message={download.isError ? errorMessage(download.error) : null} />
          </div>
        </div>
        <aside className="space-y-3" aria-label="Codebook">
          <h2 className="text-base font-semibold text-granite-900">
            Codebook: {KIND_TEXT[kind].title.toLowerCase()}
          </h2>
          <Link to={paths.codebook.href()} className="text-xs text-glacier-700 hover:underline">
            Open the codebook on its own page
          </Link>
          {codebook.isPending ? <PageSpinner label="Loading the codebook" /> : null}
          {codebook.isError ? <QueryError error={codebook.error} what="the codebook" /> : null}
          {codebook.data ? (
            <>
              <p className="text-xs text-granite-600">{codebook.data.numbers}</p>
              {kind === 'frames' ? (
                <p className="text-xs text-granite-600">{codebook.data.smoothing}</p>
              ) : null}
              <CodebookTable columns={codebook.data.columns} kind={kind} />
            </>
          ) : null}
          <p className="text-xs text-granite-600">
            Exports carry athlete ids, never names or contact details. They hold data of minors: store them
            where your club&apos;s data-protection rules allow, and delete them when the analysis is done.
          </p>
        </aside>
      </div>
    </>
  );
}
