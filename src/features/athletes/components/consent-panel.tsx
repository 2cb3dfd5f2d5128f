import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  recordConsentSchema,
  type AthleteDetailDto,
  type RecordConsentInput,
} from '@shared/schemas/athlete.schema';
import { Button } from '@/components/ui/button';
import { FormError, SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useRecordConsent } from '../api/record-consent';

const METHOD_LABELS: Record<RecordConsentInput['method'], string> = {
  signed_form: 'Signed form',
  email: 'By e-mail',
  in_person: 'In person',
};

function ConsentForm({ athlete }: { athlete: AthleteDetailDto }) {
  const toast = useToast();
  const consent = useRecordConsent(athlete.id);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<z.input<typeof recordConsentSchema>, unknown, RecordConsentInput>({
    resolver: zodResolver(recordConsentSchema),
    defaultValues: {
      guardianName: athlete.guardians[0]?.name ?? '',
      method: 'signed_form',
      shareByEmail: false,
    },
  });
  const listId = `guardians-${athlete.id}`;

  return (
    <form
      noValidate
      aria-label="Record consent"
      className="mt-4 space-y-3"
      onSubmit={handleSubmit((values) =>
        consent.mutate(values, {
          onSuccess: () => toast.success(`Consent recorded for ${athlete.firstName}.`),
        }),
      )}
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          label="Guardian who gave consent"
          list={listId}
          error={errors.guardianName?.message}
          {...register('guardianName')}
        />
        <datalist id={listId}>
          {athlete.guardians.map((guardian) => (
            <option key={guardian.id} value={guardian.name} />
          ))}
        </datalist>
        <SelectField label="How it was given" error={errors.method?.message} {...register('method')}>
          {Object.entries(METHOD_LABELS).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </SelectField>
      </div>
      <label className="flex items-start gap-2 text-sm text-granite-800">
        <input type="checkbox" className="mt-0.5 h-4 w-4" {...register('shareByEmail')} />
        <span>
          The guardian also agreed to reviews being sent by e-mail to {athlete.firstName} and guardians.
          Without it, reviews are only shown in the app.
        </span>
      </label>
      <FormError message={consent.isError ? errorMessage(consent.error) : null} />
      <Button type="submit" busy={consent.isPending}>
        Record consent
      </Button>
    </form>
  );
}

/** Shown for under-18s without recorded consent: the caution for everyone, the form for coaches. */
export function ConsentPanel({ athlete, canRecord }: { athlete: AthleteDetailDto; canRecord: boolean }) {
  if (athlete.consent.status !== 'missing') return null;
  return (
    <Notice tone="caution" title="Guardian consent not recorded">
      <p>
        {athlete.firstName} is under 18. Video of an athlete is personal data: no clip of {athlete.firstName}{' '}
        can be stored until a guardian&apos;s consent is recorded. Guardians may ask for clips to be deleted
        at any time.
      </p>
      {canRecord ? (
        <ConsentForm athlete={athlete} />
      ) : (
        <p className="mt-2">Ask the athlete&apos;s coach to record consent.</p>
      )}
    </Notice>
  );
}
