import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import {
  privacySettingsSchema,
  type PrivacySettingsDto,
  type PrivacySettingsInput,
} from '@shared/schemas/consent.schema';
import { Button } from '@/components/ui/button';
import { FormError, TextField } from '@/components/ui/field';
import { Card } from '@/components/ui/page-header';
import { QueryError } from '@/components/ui/query-error';
import { PageSpinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { placeFieldIssues } from '@/lib/form-errors';
import { formatDateTime, formatDay } from '@/lib/format';
import { usePrivacySettings, useUpdatePrivacySettings } from '../api/privacy-settings';

const FIELDS = ['consentGraceDays', 'retentionDaysAfterSeason'] as const;

interface FormValues {
  consentGraceDays: number;
  keepClips: boolean;
  retentionDaysAfterSeason: number | null;
}

function SettingsForm({ data }: { data: PrivacySettingsDto }) {
  const toast = useToast();
  const update = useUpdatePrivacySettings();
  const {
    register,
    handleSubmit,
    watch,
    reset,
    setError,
    formState: { errors, isDirty },
  } = useForm<FormValues>({
    defaultValues: {
      consentGraceDays: data.consentGraceDays,
      keepClips: data.retentionDaysAfterSeason === null,
      retentionDaysAfterSeason: data.retentionDaysAfterSeason ?? 365,
    },
  });
  useEffect(() => {
    reset({
      consentGraceDays: data.consentGraceDays,
      keepClips: data.retentionDaysAfterSeason === null,
      retentionDaysAfterSeason: data.retentionDaysAfterSeason ?? 365,
    });
  }, [data, reset]);
  const keepClips = watch('keepClips');

  const onSubmit = (values: FormValues) => {
    // The shared schema judges the values as the API will; the checkbox only decides "kept".
    const parsed = privacySettingsSchema.safeParse({
      consentGraceDays: values.consentGraceDays,
      retentionDaysAfterSeason: values.keepClips ? null : values.retentionDaysAfterSeason,
    });
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const field = issue.path[0];
        if (field === 'consentGraceDays' || field === 'retentionDaysAfterSeason')
          setError(field, { message: issue.message });
      }
      return;
    }
    const input: PrivacySettingsInput = parsed.data;
    update.mutate(input, {
      onSuccess: () => toast.success('Privacy settings saved'),
      onError: (failure) => placeFieldIssues(failure, FIELDS, setError),
    });
  };

  return (
    <form noValidate aria-label="Privacy settings" className="space-y-4" onSubmit={handleSubmit(onSubmit)}>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Grace period after consent is withdrawn (days)"
          type="number"
          min={0}
          inputMode="numeric"
          hint="Clips and reviews are hidden at once and erased when it ends. 0 erases at once."
          error={errors.consentGraceDays?.message}
          {...register('consentGraceDays', { valueAsNumber: true })}
        />
        <div className="space-y-2">
          <TextField
            label="Keep clips after a season ends (days)"
            type="number"
            min={7}
            inputMode="numeric"
            disabled={keepClips}
            hint="The head coach is e-mailed a week before a season’s clips are erased."
            error={errors.retentionDaysAfterSeason?.message}
            {...register('retentionDaysAfterSeason', { valueAsNumber: true })}
          />
          <label className="flex items-center gap-2 text-sm text-granite-800">
            <input type="checkbox" className="h-4 w-4" {...register('keepClips')} />
            Keep clips until deleted by hand
          </label>
        </div>
      </div>
      <FormError message={update.isError ? errorMessage(update.error) : null} />
      <Button type="submit" busy={update.isPending} disabled={!isDirty}>
        Save privacy settings
      </Button>
    </form>
  );
}

/** The head coach's privacy settings, the seasons' erasure dates and the athletes waiting for erasure. */
export function PrivacySettingsCard() {
  const settings = usePrivacySettings();
  return (
    <Card title="Privacy">
      <div id="privacy" className="space-y-6">
        {settings.isPending ? <PageSpinner label="Loading privacy settings" /> : null}
        {settings.isError ? (
          <QueryError
            error={settings.error}
            what="the privacy settings"
            retry={() => void settings.refetch()}
          />
        ) : null}
        {settings.data ? (
          <>
            <SettingsForm data={settings.data} />
            <section aria-labelledby="retention-seasons">
              <h3 id="retention-seasons" className="mb-2 text-sm font-semibold text-granite-900">
                Clips by season
              </h3>
              {settings.data.seasons.length === 0 ? (
                <p className="text-sm text-granite-600">
                  No seasons yet; add one on an athlete’s season plan.
                </p>
              ) : (
                <table className="w-full text-left text-sm">
                  <thead className="text-granite-600">
                    <tr>
                      <th className="py-1 font-medium">Season</th>
                      <th className="py-1 font-medium">Clips</th>
                      <th className="py-1 font-medium">Erased on</th>
                    </tr>
                  </thead>
                  <tbody className="divide-y divide-granite-100">
                    {settings.data.seasons.map((s) => (
                      <tr key={s.seasonId}>
                        <td className="py-1.5">
                          {s.name} <span className="text-granite-600">(ends {formatDay(s.endsOn)})</span>
                        </td>
                        <td className="py-1.5">{s.clips}</td>
                        <td className="py-1.5">
                          {s.erasesOn ? formatDay(s.erasesOn) : 'Kept'}
                          {s.noticeSentAt ? (
                            <span className="block text-xs text-granite-600">
                              notice sent {formatDateTime(s.noticeSentAt)}
                            </span>
                          ) : null}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              )}
            </section>
            <section aria-labelledby="pending-erasures">
              <h3 id="pending-erasures" className="mb-2 text-sm font-semibold text-granite-900">
                Waiting for erasure after a withdrawal
              </h3>
              {settings.data.pendingErasures.length === 0 ? (
                <p className="text-sm text-granite-600">No athlete’s consent is withdrawn.</p>
              ) : (
                <ul className="divide-y divide-granite-100 text-sm">
                  {settings.data.pendingErasures.map((p) => (
                    <li key={p.athleteId} className="flex flex-wrap justify-between gap-2 py-1.5">
                      <Link
                        className="font-medium text-glacier-700 hover:underline"
                        to={paths.athlete.href(p.athleteId)}
                      >
                        {p.name}
                      </Link>
                      <span className="text-granite-600">
                        {p.clips} {p.clips === 1 ? 'clip' : 'clips'}, erased on{' '}
                        {formatDay(p.erasureDueAt.slice(0, 10))}
                      </span>
                    </li>
                  ))}
                </ul>
              )}
            </section>
            <p className="text-xs text-granite-600">
              {settings.data.lastSweepAt
                ? `Last daily check: ${formatDateTime(settings.data.lastSweepAt)}.`
                : 'The daily check has not run yet.'}{' '}
              Set these to match your club’s policy and local rules on keeping the data of minors.
            </p>
          </>
        ) : null}
      </div>
    </Card>
  );
}
