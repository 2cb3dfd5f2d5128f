import type { SessionDto } from '@shared/schemas/session.schema';
import { Card } from '@/components/ui/page-header';
import { disciplineLabel, SNOW_LABELS } from './session-labels';

export function SessionSummary({ session }: { session: SessionDto }) {
  return (
    <Card title="Session">
      <dl className="grid grid-cols-[7rem_1fr] gap-x-4 gap-y-2.5 text-sm">
        <dt className="text-granite-600">Venue</dt>
        <dd>{session.venue}</dd>
        <dt className="text-granite-600">Discipline</dt>
        <dd>{disciplineLabel(session.discipline)}</dd>
        <dt className="text-granite-600">Snow</dt>
        <dd>{SNOW_LABELS[session.snow]}</dd>
        <dt className="text-granite-600">Clips</dt>
        <dd>{session.clipCount}</dd>
        {session.notes ? (
          <>
            <dt className="text-granite-600">Notes</dt>
            <dd className="whitespace-pre-line">{session.notes}</dd>
          </>
        ) : null}
      </dl>
    </Card>
  );
}
