import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  toleranceBandInputSchema,
  type ToleranceBandDto,
  type ToleranceBandFormValues,
  type ToleranceBandInput,
} from '@shared/schemas/tolerance.schema';
import { BAND_METRICS, outsideMeaning, type BandMetricKey } from '@shared/tolerance';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { placeFieldIssues } from '@/lib/form-errors';

const UNIT_WORDS = {
  deg: 'degrees',
  ratio: 'ratio',
  'shin lengths': 'shin lengths',
  'hip widths': 'hip widths',
} as const;
const FIELDS = ['min', 'max', 'target'] as const;

/** An empty box is "no limit"; anything else must read as a number (the schema says which). */
const asNumber = (text: unknown) =>
  text === '' || text === null || text === undefined ? null : Number(text);

interface BandFormProps {
  metric: BandMetricKey;
  ageGroupName: string;
  band: ToleranceBandDto | null;
  busy: boolean;
  error: unknown;
  onSubmit(input: ToleranceBandInput): Promise<unknown>;
  onCancel(): void;
}

/** Lowest, highest and target value of one band, checked by the same schema the server uses. */
export function BandForm({ metric, ageGroupName, band, busy, error, onSubmit, onCancel }: BandFormProps) {
  const info = BAND_METRICS[metric];
  const {
    register,
    handleSubmit,
    control,
    setError,
    formState: { errors },
  } = useForm<ToleranceBandFormValues, unknown, ToleranceBandInput>({
    resolver: zodResolver(toleranceBandInputSchema(metric)),
    defaultValues: { min: band?.min ?? null, max: band?.max ?? null, target: band?.target ?? null },
  });
  const [min, max] = useWatch({ control, name: ['min', 'max'] });
  const preview =
    Number.isFinite(min ?? 0) && Number.isFinite(max ?? 0) ? outsideMeaning(metric, min, max) : null;
  const field = (name: (typeof FIELDS)[number]) => register(name, { setValueAs: asNumber });

  return (
    <form
      noValidate
      aria-label={`Band for ${info.label}, ${ageGroupName}`}
      className="space-y-4"
      onSubmit={handleSubmit((values) =>
        onSubmit(values).catch((failure: unknown) => placeFieldIssues(failure, FIELDS, setError)),
      )}
    >
      <p className="text-sm text-granite-600">
        {info.per === 'turn' ? 'Judged once per turn' : 'Judged on every analysed frame'}, in{' '}
        {UNIT_WORDS[info.unit]}. Possible values run from {info.range[0]} to {info.range[1]}. Leave a box
        empty for no limit on that side.
      </p>
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label="Lowest" inputMode="decimal" error={errors.min?.message} {...field('min')} />
        <TextField label="Highest" inputMode="decimal" error={errors.max?.message} {...field('max')} />
        <TextField
          label="Target (optional)"
          inputMode="decimal"
          error={errors.target?.message}
          {...field('target')}
        />
      </div>
      {preview ? (
        <p className="rounded-md bg-granite-50 px-3 py-2 text-sm text-granite-800">
          <span className="font-medium">Flagged when: </span>
          {preview}
        </p>
      ) : null}
      <p className="text-xs text-granite-600">
        Saving re-checks every stored frame of {ageGroupName} in the background; new flags appear on the
        coaches&apos; Home as it goes.
      </p>
      <FormError message={error ? errorMessage(error) : null} />
      <div className="flex justify-end gap-2">
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" busy={busy}>
          Save band
        </Button>
      </div>
    </form>
  );
}
