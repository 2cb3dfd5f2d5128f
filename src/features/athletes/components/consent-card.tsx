import { useState } from 'react';
import { Download, RotateCcw, ShieldOff } from 'lucide-react';
import type { AthleteDetailDto } from '@shared/schemas/athlete.schema';
import type { UserDto } from '@shared/schemas/auth.schema';
import {
  CONSENT_PURPOSE_LABELS,
  type ConsentAction,
  type ConsentDecisionInput,
  type ConsentEventDto,
} from '@shared/schemas/consent.schema';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { Card } from '@/components/ui/page-header';
import { Spinner } from '@/components/ui/spinner';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { formatDateTime, formatDay } from '@/lib/format';
import { can } from '@/lib/permissions';
import {
  useAthleteExport,
  useConsentDecision,
  useConsentRecord,
  useGuardianAccess,
} from '../api/consent-api';
import { ConsentBadge } from './consent-badge';

const ACTION_WORDS: Record<ConsentAction, string> = {
  given: 'Consent given',
  withdrawn: 'Consent withdrawn',
  restored: 'Consent restored',
  erased: 'Clips and reviews erased',
  guardian_kept: 'Guardian’s access kept',
  guardian_ended: 'Guardian’s access ended',
};

const METHOD_WORDS: Record<string, string> = {
  signed_form: 'signed form',
  email: 'e-mail',
  in_person: 'in person',
  in_app: 'in the app',
};

/** Who may withdraw or restore here: a guardian for a minor, the athlete once 18, or the head coach. */
function mayDecide(user: UserDto, athlete: AthleteDetailDto): boolean {
  if (!can(user.role, 'consent.decide')) return false;
  if (user.role === 'guardian') return athlete.consent.managedBy === 'guardian';
  if (user.role === 'athlete')
    return athlete.consent.managedBy === 'athlete' && user.athleteId === athlete.id;
  return true;
}

function day(iso: string): string {
  return formatDay(iso.slice(0, 10));
}

function ConsentRecordList({ events }: { events: ConsentEventDto[] }) {
  if (events.length === 0) return <p className="text-sm text-granite-600">Nothing recorded yet.</p>;
  return (
    <ol aria-label="Consent record" className="divide-y divide-granite-100 text-sm">
      {[...events].reverse().map((e) => (
        <li key={e.id} className="py-2">
          <p className="font-medium text-granite-900">
            {ACTION_WORDS[e.action]}
            {e.purposes.length > 0 ? (
              <span className="font-normal text-granite-700">
                {' '}
                for {e.purposes.map((p) => CONSENT_PURPOSE_LABELS[p]).join(' and ')}
              </span>
            ) : null}
          </p>
          <p className="text-granite-600">
            {e.decidedBy}
            {e.method ? `, ${METHOD_WORDS[e.method] ?? e.method}` : ''} · {formatDateTime(e.at)}
            {e.recordedBy && e.recordedBy !== e.decidedBy ? ` · recorded by ${e.recordedBy}` : ''}
          </p>
        </li>
      ))}
    </ol>
  );
}

/** The head coach records whose request it is and how it came; guardians and adults act for themselves. */
function DecisionDialog({
  athlete,
  action,
  user,
  open,
  onClose,
}: {
  athlete: AthleteDetailDto;
  action: 'withdraw' | 'restore';
  user: UserDto;
  open: boolean;
  onClose: () => void;
}) {
  const toast = useToast();
  const decision = useConsentDecision(athlete.id, action);
  const [decidedBy, setDecidedBy] = useState(athlete.guardians[0]?.name ?? '');
  const [method, setMethod] = useState<NonNullable<ConsentDecisionInput['method']>>('email');
  const recording = user.role === 'head_coach';
  const name = athlete.firstName;
  const submit = () =>
    decision.mutate(recording ? { decidedBy, method } : {}, {
      onSuccess: (data) => {
        onClose();
        toast.success(
          action === 'withdraw'
            ? `Consent withdrawn. ${name}’s clips are erased on ${day(data.athlete.consent.erasureDueAt ?? new Date().toISOString())} unless it is restored.`
            : `Consent restored: ${name}’s clips are back.`,
        );
      },
    });
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={action === 'withdraw' ? `Withdraw consent for ${name}?` : `Restore consent for ${name}?`}
    >
      <div className="space-y-4 text-sm text-granite-800">
        {action === 'withdraw' ? (
          <p>
            {name}’s clips and reviews disappear at once for coaches, analysts, {name} and guardians; only the
            head coach still sees them, to answer questions. They are erased for good when the club’s grace
            period ends, unless consent is restored before then. Download the data first if you want a copy.
          </p>
        ) : (
          <p>
            Clips not yet erased come back for the coaches, and reviews for {name} and guardians. Anything
            already erased cannot come back.
          </p>
        )}
        {recording ? (
          <div className="grid gap-3 sm:grid-cols-2">
            <TextField
              label="Whose request is it"
              hint={
                athlete.consent.managedBy === 'athlete' ? 'The athlete, who is 18 or older' : 'A guardian'
              }
              value={decidedBy}
              onChange={(e) => setDecidedBy(e.target.value)}
            />
            <SelectField
              label="How it came"
              value={method}
              onChange={(e) => setMethod(e.target.value as typeof method)}
            >
              <option value="email">By e-mail</option>
              <option value="signed_form">Signed form</option>
              <option value="in_person">In person</option>
            </SelectField>
          </div>
        ) : null}
        <FormError message={decision.isError ? errorMessage(decision.error) : null} />
        <div className="flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button
            variant={action === 'withdraw' ? 'danger' : 'primary'}
            busy={decision.isPending}
            disabled={recording && decidedBy.trim() === ''}
            onClick={submit}
          >
            {action === 'withdraw' ? 'Withdraw consent' : 'Restore consent'}
          </Button>
        </div>
      </div>
    </Dialog>
  );
}

function GuardianAccessList({ athleteId }: { athleteId: string }) {
  const record = useConsentRecord(athleteId);
  const access = useGuardianAccess(athleteId);
  const list = record.data?.guardianAccess ?? [];
  if (list.length === 0) return null;
  return (
    <div className="space-y-2">
      <h3 className="text-sm font-semibold text-granite-900">Your guardians’ access</h3>
      <p className="text-sm text-granite-600">
        You are 18 or older: you decide whether a guardian still sees your clips and reviews.
      </p>
      <ul className="divide-y divide-granite-100 text-sm">
        {list.map((g) => (
          <li key={g.guardianId} className="flex flex-wrap items-center justify-between gap-2 py-2">
            <span>
              <span className="font-medium text-granite-900">{g.name}</span>{' '}
              <span className="text-granite-600">{g.hasAccess ? 'has access' : 'no longer has access'}</span>
            </span>
            <Button
              size="sm"
              variant="secondary"
              busy={access.isPending && access.variables?.guardianId === g.guardianId}
              onClick={() => access.mutate({ guardianId: g.guardianId, keep: !g.hasAccess })}
            >
              {g.hasAccess ? 'End access' : 'Keep access'}
            </Button>
          </li>
        ))}
      </ul>
      <FormError message={access.isError ? errorMessage(access.error) : null} />
    </div>
  );
}

/**
 * Consent and data of one athlete: what consent covers, the record of who decided what, withdrawing
 * and restoring it, and a download of all of the athlete's data. On the athlete page for staff, and on
 * the Home page of guardians and athletes (built for a phone held upright).
 */
export function ConsentCard({ athlete, user }: { athlete: AthleteDetailDto; user: UserDto }) {
  const [dialog, setDialog] = useState<'withdraw' | 'restore' | null>(null);
  const record = useConsentRecord(athlete.id);
  const exportData = useAthleteExport(athlete.id);
  const consent = athlete.consent;
  const decide = mayDecide(user, athlete);
  const self = user.role === 'athlete' && user.athleteId === athlete.id;
  const own = self || user.role === 'guardian' || user.role === 'head_coach';
  const withdrawable = consent.status === 'granted' || consent.status === 'not_required';

  return (
    <Card title="Consent and data">
      <div className="space-y-4">
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <ConsentBadge status={consent.status} />
          {consent.status === 'granted' || consent.status === 'not_required' ? (
            <span className="text-granite-700">
              {consent.shareByEmail
                ? 'Clips are stored and reviews are sent by e-mail.'
                : 'Clips are stored; reviews are not sent by e-mail, only shown here.'}
            </span>
          ) : null}
        </div>

        {consent.status === 'withdrawn' ? (
          <Notice tone="caution" title="Consent withdrawn">
            {consent.erasureDueAt ? (
              <p>
                Withdrawn on {day(consent.withdrawnAt!)}. {athlete.firstName}’s clips and reviews are hidden
                from everyone but the head coach and will be erased on{' '}
                <strong>{day(consent.erasureDueAt)}</strong>, unless consent is restored before then.
              </p>
            ) : (
              <p>
                Withdrawn on {day(consent.withdrawnAt!)}. {athlete.firstName}’s clips and reviews have been
                erased. No new clips can be stored unless consent is given again.
              </p>
            )}
          </Notice>
        ) : null}

        {consent.managedBy === 'athlete' && !self && user.role === 'guardian' ? (
          <p className="text-sm text-granite-600">
            {athlete.firstName} is 18 or older and decides about consent themself.
          </p>
        ) : null}
        {consent.managedBy === 'guardian' && self ? (
          <p className="text-sm text-granite-600">
            Until you are 18 a guardian decides about consent. You can still download all your data.
          </p>
        ) : null}

        <div className="flex flex-col gap-2 sm:flex-row sm:flex-wrap">
          {own && can(user.role, 'athletes.export') ? (
            <Button
              variant="secondary"
              busy={exportData.isPending}
              icon={<Download aria-hidden="true" className="h-4 w-4" />}
              onClick={() => exportData.mutate()}
            >
              Download all data
            </Button>
          ) : null}
          {decide && withdrawable ? (
            <Button
              variant="quiet"
              icon={<ShieldOff aria-hidden="true" className="h-4 w-4" />}
              onClick={() => setDialog('withdraw')}
            >
              {user.role === 'head_coach' ? 'Record a withdrawal' : 'Withdraw consent'}
            </Button>
          ) : null}
          {decide && consent.status === 'withdrawn' ? (
            <Button
              icon={<RotateCcw aria-hidden="true" className="h-4 w-4" />}
              onClick={() => setDialog('restore')}
            >
              Restore consent
            </Button>
          ) : null}
        </div>
        <FormError message={exportData.isError ? errorMessage(exportData.error) : null} />
        {exportData.data ? (
          <p role="status" className="text-sm text-granite-600">
            Your download has started: {exportData.data.clips}{' '}
            {exportData.data.clips === 1 ? 'clip' : 'clips'} with records, angles and notes, about{' '}
            {Math.max(1, Math.round(exportData.data.approxBytes / 1_000_000))} MB.
          </p>
        ) : null}

        {self && consent.managedBy === 'athlete' ? <GuardianAccessList athleteId={athlete.id} /> : null}

        <details className="text-sm">
          <summary className="cursor-pointer font-medium text-glacier-700">Consent record</summary>
          <div className="mt-2">
            {record.isPending ? <Spinner size="sm" label="Loading the consent record" /> : null}
            {record.isError ? <FormError message={errorMessage(record.error)} /> : null}
            {record.data ? <ConsentRecordList events={record.data.events} /> : null}
          </div>
        </details>
        <p className="text-xs text-granite-600">
          Follow your club’s policy and local rules on the data of minors; the club’s head coach answers
          questions about them.
        </p>
      </div>
      {dialog ? (
        <DecisionDialog athlete={athlete} action={dialog} user={user} open onClose={() => setDialog(null)} />
      ) : null}
    </Card>
  );
}
