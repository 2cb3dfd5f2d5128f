import { Controller, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createInvitationSchema, ROLES, type CreateInvitationInput } from '@shared/schemas/auth.schema';
import { Button } from '@/components/ui/button';
import { FormError, SelectField, TextField } from '@/components/ui/field';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { ROLE_LABELS } from '@/lib/permissions';
import { useCreateInvitation } from '../api/create-invitation';

export interface Option {
  id: string;
  label: string;
}

interface InviteFormProps {
  athletes: Option[];
  ageGroups: Option[];
}

const EMPTY: CreateInvitationInput = { email: '', role: 'coach', athleteId: undefined, ageGroupIds: [] };

export function InviteForm({ athletes, ageGroups }: InviteFormProps) {
  const toast = useToast();
  const invite = useCreateInvitation();
  const {
    register,
    handleSubmit,
    control,
    reset,
    formState: { errors },
  } = useForm<CreateInvitationInput>({ resolver: zodResolver(createInvitationSchema), defaultValues: EMPTY });
  const role = useWatch({ control, name: 'role' });
  const needsAthlete = role === 'athlete' || role === 'guardian';

  return (
    <form
      noValidate
      aria-label="Invite a member"
      className="space-y-4"
      onSubmit={handleSubmit((values) => {
        const input: CreateInvitationInput = {
          email: values.email,
          role: values.role,
          athleteId: needsAthlete ? values.athleteId : undefined,
          ageGroupIds: values.role === 'coach' ? values.ageGroupIds : undefined,
        };
        invite.mutate(input, {
          onSuccess: () => {
            toast.success(`Invitation sent to ${input.email}.`);
            reset(EMPTY);
          },
        });
      })}
    >
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Email"
          type="email"
          autoComplete="off"
          error={errors.email?.message}
          {...register('email')}
        />
        <SelectField label="Role" error={errors.role?.message} {...register('role')}>
          {ROLES.map((value) => (
            <option key={value} value={value}>
              {ROLE_LABELS[value]}
            </option>
          ))}
        </SelectField>
      </div>
      {needsAthlete ? (
        <SelectField
          label={role === 'athlete' ? 'Athlete record' : 'Guardian of'}
          hint={
            role === 'athlete'
              ? 'The athlete this sign-in belongs to.'
              : 'The child this guardian may follow.'
          }
          error={errors.athleteId?.message}
          {...register('athleteId', { setValueAs: (value: string) => value || undefined })}
        >
          <option value="">Choose an athlete…</option>
          {athletes.map((athlete) => (
            <option key={athlete.id} value={athlete.id}>
              {athlete.label}
            </option>
          ))}
        </SelectField>
      ) : null}
      {role === 'coach' ? (
        <Controller
          control={control}
          name="ageGroupIds"
          render={({ field }) => (
            <fieldset>
              <legend className="mb-1 text-sm font-medium text-granite-800">Age groups they coach</legend>
              <div className="flex flex-wrap gap-x-4 gap-y-2">
                {ageGroups.map((group) => {
                  const selected = field.value ?? [];
                  return (
                    <label key={group.id} className="inline-flex items-center gap-2 text-sm">
                      <input
                        type="checkbox"
                        className="h-4 w-4 accent-glacier-700"
                        checked={selected.includes(group.id)}
                        onChange={(event) =>
                          field.onChange(
                            event.target.checked
                              ? [...selected, group.id]
                              : selected.filter((id) => id !== group.id),
                          )
                        }
                      />
                      {group.label}
                    </label>
                  );
                })}
              </div>
            </fieldset>
          )}
        />
      ) : null}
      <FormError message={invite.isError ? errorMessage(invite.error) : null} />
      <Button type="submit" busy={invite.isPending}>
        Send invitation
      </Button>
    </form>
  );
}
