import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { Card } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { formatBytes, formatDateTime, formatDuration } from '@/lib/format';
import { ClipStatusBadge } from './clip-status-badge';

interface ClipDetailsProps {
  clip: ClipDto;
  linkAthletes: boolean;
  linkSession: boolean;
}

export function ClipDetails({ clip, linkAthletes, linkSession }: ClipDetailsProps) {
  const rows: [string, ReactNode][] = [
    ['Status', <ClipStatusBadge key="status" status={clip.status} />],
    [
      'Athletes',
      clip.athletes.length === 0
        ? 'None tagged'
        : clip.athletes.map((athlete, index) => (
            <span key={athlete.id}>
              {index > 0 ? ', ' : null}
              {linkAthletes ? (
                <Link className="text-glacier-700 hover:underline" to={paths.athlete.href(athlete.id)}>
                  {athlete.name}
                </Link>
              ) : (
                athlete.name
              )}
            </span>
          )),
    ],
    ['View', clip.view === 'front' ? 'Front' : 'Side'],
    ['Duration', clip.durationMs !== null ? formatDuration(clip.durationMs) : 'Not measured yet'],
    ['Frame size', clip.width && clip.height ? `${clip.width} × ${clip.height}` : 'Not measured yet'],
    ['Frame rate', clip.fps ? `${Number(clip.fps.toFixed(2))} fps` : 'Not measured yet'],
    ['Codec', clip.codec ?? 'Not measured yet'],
    ['File size', formatBytes(clip.sizeBytes)],
    ['Uploaded', formatDateTime(clip.createdAt)],
  ];
  return (
    <Card title="Clip">
      <dl className="grid grid-cols-[6.5rem_1fr] gap-x-4 gap-y-2 text-sm">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-granite-600">{label}</dt>
            <dd className="min-w-0 break-words text-granite-900">{value}</dd>
          </div>
        ))}
      </dl>
      {clip.status === 'failed' && clip.failureReason ? (
        <p className="mt-3 text-sm text-alarm-600">{clip.failureReason}</p>
      ) : null}
      {linkSession ? (
        <p className="mt-4 text-sm">
          <Link
            className="font-medium text-glacier-700 hover:underline"
            to={paths.session.href(clip.sessionId)}
          >
            Open the session
          </Link>
        </p>
      ) : null}
    </Card>
  );
}
