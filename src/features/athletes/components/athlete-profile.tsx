import type { ReactNode } from 'react';
import type { AthleteDetailDto } from '@shared/schemas/athlete.schema';
import { Card } from '@/components/ui/page-header';
import { formatDateTime } from '@/lib/format';
import { ConsentBadge } from './consent-badge';

export function AthleteProfile({ athlete }: { athlete: AthleteDetailDto }) {
  const rows: [string, ReactNode][] = [
    ['Age group', `${athlete.ageGroup.name} (ages ${athlete.ageGroup.minAge}–${athlete.ageGroup.maxAge})`],
    ['Born', athlete.birthYear],
    ['Clips', athlete.clipCount],
    [
      'Consent',
      <span key="consent" className="flex flex-wrap items-center gap-2">
        <ConsentBadge status={athlete.consent.status} />
        {athlete.consent.status === 'granted' && athlete.consent.recordedAt ? (
          <span className="text-xs text-granite-600">
            from {athlete.consent.guardianName ?? 'a guardian'}, {formatDateTime(athlete.consent.recordedAt)}
          </span>
        ) : null}
      </span>,
    ],
  ];
  return (
    <Card title="Profile">
      <dl className="grid grid-cols-[8rem_1fr] gap-x-4 gap-y-2.5 text-sm">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-granite-600">{label}</dt>
            <dd className="text-granite-900">{value}</dd>
          </div>
        ))}
      </dl>
    </Card>
  );
}
