import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  createSessionSchema,
  DISCIPLINES,
  SNOW_CONDITIONS,
  type CreateSessionInput,
  type SessionDto,
} from '@shared/schemas/session.schema';
import { Button } from '@/components/ui/button';
import { FormError, SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { errorMessage } from '@/lib/api-client';
import { useCreateSession } from '../api/create-session';
import { FilmingCaution } from './filming-caution';
import { disciplineLabel, SNOW_LABELS } from './session-labels';

function today(): string {
  const now = new Date();
  const local = new Date(now.getTime() - now.getTimezoneOffset() * 60_000);
  return local.toISOString().slice(0, 10);
}

interface CreateSessionFormProps {
  onCreated: (session: SessionDto) => void;
  onCancel: () => void;
}

export function CreateSessionForm({ onCreated, onCancel }: CreateSessionFormProps) {
  const createMutation = useCreateSession();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<CreateSessionInput>({
    resolver: zodResolver(createSessionSchema),
    defaultValues: { date: today(), venue: '', discipline: 'giant_slalom', snow: 'packed', notes: '' },
  });

  return (
    <form
      noValidate
      className="space-y-4"
      onSubmit={handleSubmit((values) =>
        createMutation.mutate(
          { ...values, notes: values.notes ? values.notes : undefined },
          { onSuccess: (data) => onCreated(data.session) },
        ),
      )}
    >
      <FilmingCaution />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Date" type="date" error={errors.date?.message} {...register('date')} />
        <TextField
          label="Venue"
          placeholder="Hill and run"
          error={errors.venue?.message}
          {...register('venue')}
        />
        <SelectField label="Discipline" error={errors.discipline?.message} {...register('discipline')}>
          {DISCIPLINES.map((value) => (
            <option key={value} value={value}>
              {disciplineLabel(value)}
            </option>
          ))}
        </SelectField>
        <SelectField label="Snow" error={errors.snow?.message} {...register('snow')}>
          {SNOW_CONDITIONS.map((value) => (
            <option key={value} value={value}>
              {SNOW_LABELS[value]}
            </option>
          ))}
        </SelectField>
      </div>
      <TextAreaField
        label="Notes"
        hint="Optional: course set, drills, weather."
        error={errors.notes?.message}
        {...register('notes')}
      />
      <FormError message={createMutation.isError ? errorMessage(createMutation.error) : null} />
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" busy={createMutation.isPending}>
          Create session
        </Button>
      </div>
    </form>
  );
}
