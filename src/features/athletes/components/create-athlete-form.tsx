import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createAthleteSchema, type AgeGroupDto, type AthleteDetailDto } from '@shared/schemas/athlete.schema';
import { Button } from '@/components/ui/button';
import { FormError, SelectField, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { useCreateAthlete } from '../api/create-athlete';

interface CreateAthleteFormProps {
  ageGroups: AgeGroupDto[];
  onCreated: (athlete: AthleteDetailDto) => void;
  onCancel: () => void;
}

export function CreateAthleteForm({ ageGroups, onCreated, onCancel }: CreateAthleteFormProps) {
  const createMutation = useCreateAthlete();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm({
    resolver: zodResolver(createAthleteSchema),
    defaultValues: { firstName: '', lastName: '', birthYear: '', ageGroupId: ageGroups[0]?.id ?? '' },
  });

  return (
    <form
      noValidate
      className="space-y-4"
      onSubmit={handleSubmit((values) =>
        createMutation.mutate(values, { onSuccess: (data) => onCreated(data.athlete) }),
      )}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="First name"
          autoComplete="off"
          error={errors.firstName?.message}
          {...register('firstName')}
        />
        <TextField
          label="Last name"
          autoComplete="off"
          error={errors.lastName?.message}
          {...register('lastName')}
        />
        <TextField
          label="Birth year"
          inputMode="numeric"
          placeholder="e.g. 2013"
          error={errors.birthYear?.message}
          {...register('birthYear')}
        />
        <SelectField label="Age group" error={errors.ageGroupId?.message} {...register('ageGroupId')}>
          {ageGroups.map((group) => (
            <option key={group.id} value={group.id}>
              {group.name} (ages {group.minAge}–{group.maxAge})
            </option>
          ))}
        </SelectField>
      </div>
      <p className="text-xs text-granite-600">
        Athletes under 18 need a guardian&apos;s recorded consent before any clip of them can be stored.
      </p>
      <FormError message={createMutation.isError ? errorMessage(createMutation.error) : null} />
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" busy={createMutation.isPending}>
          Add athlete
        </Button>
      </div>
    </form>
  );
}
