import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { seasonInputSchema, type SeasonInput } from '@shared/schemas/plan.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { placeFieldIssues } from '@/lib/form-errors';
import { useCreateSeason } from '../api/plan-api';

/** The season holding today, July to June, as a starting suggestion. */
function suggestedSeason(today = new Date()): SeasonInput {
  const year = today.getUTCMonth() >= 6 ? today.getUTCFullYear() : today.getUTCFullYear() - 1;
  return {
    name: `${year}-${String((year + 1) % 100).padStart(2, '0')}`,
    startsOn: `${year}-07-01`,
    endsOn: `${year + 1}-06-30`,
  };
}

/** The head coach adds a season; clips then belong to it by their session's date. */
export function SeasonForm() {
  const create = useCreateSeason();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<SeasonInput>({ resolver: zodResolver(seasonInputSchema), defaultValues: suggestedSeason() });
  return (
    <form
      noValidate
      aria-label="New season"
      className="grid gap-3 sm:grid-cols-[1fr_1fr_1fr_auto] sm:items-end"
      onSubmit={handleSubmit((values) =>
        create
          .mutateAsync(values)
          .catch((failure: unknown) => placeFieldIssues(failure, ['name', 'startsOn', 'endsOn'], setError)),
      )}
    >
      <TextField label="Season" error={errors.name?.message} {...register('name')} />
      <TextField label="Starts" type="date" error={errors.startsOn?.message} {...register('startsOn')} />
      <TextField label="Ends" type="date" error={errors.endsOn?.message} {...register('endsOn')} />
      <Button type="submit" busy={create.isPending}>
        Add season
      </Button>
      <div className="sm:col-span-4">
        <FormError message={create.error ? errorMessage(create.error) : null} />
      </div>
    </form>
  );
}
