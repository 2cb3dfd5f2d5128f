import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { FOCUS_PHASE_LABELS, FOCUS_PHASES, fixedPhaseOf } from '@shared/plan';
import {
  FOCUS_STATUSES,
  FOCUS_STATUS_LABELS,
  focusPointInputSchema,
  type FocusPointDto,
  type FocusPointFormValues,
  type FocusPointInput,
} from '@shared/schemas/plan.schema';
import { BAND_METRICS, BAND_METRIC_KEYS, type BandMetricKey } from '@shared/tolerance';
import { Button } from '@/components/ui/button';
import { FormError, SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { placeFieldIssues } from '@/lib/form-errors';

const FIELDS = ['title', 'cue', 'metric', 'phase', 'targetMin', 'targetMax', 'direction', 'status'] as const;
const UNIT_WORDS = {
  deg: 'degrees',
  ratio: 'a ratio',
  'shin lengths': 'shin lengths',
  'hip widths': 'hip widths',
} as const;

const asNumber = (text: unknown) =>
  text === '' || text === null || text === undefined ? null : Number(text);
const asNullable = (text: unknown) => (text === '' || text === undefined ? null : text);

interface FocusPointFormProps {
  seasonId: string;
  point: FocusPointDto | null;
  busy: boolean;
  error: unknown;
  onSubmit(input: FocusPointInput): Promise<unknown>;
  onCancel(): void;
}

/** A focus point in the coach's words, tied to a metric (phase and target) or kept as free text. */
export function FocusPointForm({ seasonId, point, busy, error, onSubmit, onCancel }: FocusPointFormProps) {
  const {
    register,
    handleSubmit,
    control,
    setError,
    setValue,
    formState: { errors },
  } = useForm<FocusPointFormValues, unknown, FocusPointInput>({
    resolver: zodResolver(focusPointInputSchema),
    defaultValues: {
      seasonId,
      title: point?.title ?? '',
      cue: point?.cue ?? '',
      metric: point?.metric ?? null,
      phase: point?.phase ?? null,
      targetMin: point?.targetMin ?? null,
      targetMax: point?.targetMax ?? null,
      direction: point?.direction ?? null,
      status: point?.status ?? 'planned',
    },
  });
  const metric = useWatch({ control, name: 'metric' }) as BandMetricKey | null;
  const info = metric ? BAND_METRICS[metric] : null;
  const fixed = metric ? fixedPhaseOf(metric) : null;
  const phases = fixed ? [fixed] : info?.view === 'side' ? (['turn'] as const) : FOCUS_PHASES;

  return (
    <form
      noValidate
      aria-label={point ? `Edit ${point.title}` : 'New focus point'}
      className="space-y-4"
      onSubmit={handleSubmit((values) =>
        onSubmit(values).catch((failure: unknown) => placeFieldIssues(failure, FIELDS, setError)),
      )}
    >
      <TextField
        label="Title"
        placeholder="e.g. Knees apart at the apex"
        error={errors.title?.message}
        {...register('title')}
      />
      <TextAreaField
        label="Your cue (optional)"
        hint="In your own words, as you would say it on the hill."
        error={errors.cue?.message}
        {...register('cue')}
      />
      <SelectField
        label="Measured by"
        error={errors.metric?.message}
        {...register('metric', {
          setValueAs: asNullable,
          onChange: (event: { target: { value: string } }) => {
            const next = event.target.value as BandMetricKey | '';
            const nextFixed = next ? fixedPhaseOf(next) : null;
            const side = next ? BAND_METRICS[next].view === 'side' : false;
            setValue('phase', next ? (nextFixed ?? (side ? 'turn' : 'apex')) : null);
          },
        })}
      >
        <option value="">Nothing: a point in words only</option>
        {BAND_METRIC_KEYS.map((key) => (
          <option key={key} value={key}>
            {BAND_METRICS[key].label}
            {BAND_METRICS[key].view === 'both' ? '' : ` (${BAND_METRICS[key].view} view)`}
          </option>
        ))}
      </SelectField>
      {info ? (
        <>
          <SelectField
            label="Judged"
            error={errors.phase?.message}
            hint={
              info.view === 'side'
                ? 'Turns are found in front views; a side view is judged over the whole clip.'
                : 'Each clip shows the median over its turns.'
            }
            {...register('phase', { setValueAs: asNullable })}
          >
            {phases.map((phase) => (
              <option key={phase} value={phase}>
                {FOCUS_PHASE_LABELS[phase]}
              </option>
            ))}
          </SelectField>
          <fieldset className="space-y-2">
            <legend className="text-sm font-medium text-granite-800">
              Target, in {UNIT_WORDS[info.unit]}: a range, or a direction to move in
            </legend>
            <div className="grid gap-3 sm:grid-cols-3">
              <TextField
                label="Lowest"
                inputMode="decimal"
                error={errors.targetMin?.message}
                {...register('targetMin', { setValueAs: asNumber })}
              />
              <TextField
                label="Highest"
                inputMode="decimal"
                error={errors.targetMax?.message}
                {...register('targetMax', { setValueAs: asNumber })}
              />
              <SelectField
                label="Or direction"
                error={errors.direction?.message}
                {...register('direction', { setValueAs: asNullable })}
              >
                <option value="">None (use the range)</option>
                <option value="increase">Higher is better</option>
                <option value="decrease">Lower is better</option>
              </SelectField>
            </div>
          </fieldset>
        </>
      ) : null}
      <SelectField label="Status" error={errors.status?.message} {...register('status')}>
        {FOCUS_STATUSES.map((status) => (
          <option key={status} value={status}>
            {FOCUS_STATUS_LABELS[status]}
          </option>
        ))}
      </SelectField>
      <FormError message={error ? errorMessage(error) : null} />
      <div className="flex justify-end gap-2">
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" busy={busy}>
          {point ? 'Save focus point' : 'Add focus point'}
        </Button>
      </div>
    </form>
  );
}
