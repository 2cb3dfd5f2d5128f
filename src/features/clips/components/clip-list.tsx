import { Link } from 'react-router-dom';
import { Film } from 'lucide-react';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { AnalysisBadge } from '@/components/analysis-badge';
import { Badge } from '@/components/ui/badge';
import { EmptyState } from '@/components/ui/empty-state';
import { paths } from '@/config/paths';
import { formatDateTime, formatDuration } from '@/lib/format';
import { ClipStatusBadge } from './clip-status-badge';

interface ClipListProps {
  clips: ClipDto[];
  emptyTitle?: string;
  emptyText?: string;
}

export function ClipList({ clips, emptyTitle = 'No clips yet', emptyText }: ClipListProps) {
  if (clips.length === 0) return <EmptyState title={emptyTitle}>{emptyText}</EmptyState>;
  return (
    <ul className="divide-y divide-granite-100 overflow-hidden rounded-lg border border-granite-200 bg-white shadow-sm">
      {clips.map((clip) => (
        <li key={clip.id}>
          <Link
            to={paths.clip.href(clip.id)}
            className="flex items-center gap-4 px-4 py-3 hover:bg-glacier-50/60 focus-visible:bg-glacier-50"
          >
            {clip.posterUrl ? (
              <img src={clip.posterUrl} alt="" className="h-12 w-20 shrink-0 rounded object-cover" />
            ) : (
              <span className="flex h-12 w-20 shrink-0 items-center justify-center rounded bg-glacier-900">
                <Film aria-hidden="true" className="h-5 w-5 text-glacier-300" />
              </span>
            )}
            <span className="min-w-0 flex-1">
              <span className="block truncate font-medium text-glacier-800">{clip.originalName}</span>
              <span className="block truncate text-xs text-granite-600">
                {clip.athletes.map((a) => a.name).join(', ') || 'No athlete tagged'} ·{' '}
                {clip.view === 'front' ? 'Front view' : 'Side view'}
                {clip.durationMs ? ` · ${formatDuration(clip.durationMs)}` : ''} ·{' '}
                {formatDateTime(clip.createdAt)}
              </span>
            </span>
            <span className="flex shrink-0 items-center gap-2">
              {clip.status === 'ready' ? (
                // On a phone held upright the clip's name needs the width more than its analysis state.
                <span className="hidden sm:inline-flex">
                  <AnalysisBadge
                    storedFrames={clip.analysis?.frameCount ?? 0}
                    frameCount={clip.frameCount}
                    serverAnalysis={clip.serverAnalysis}
                  />
                </span>
              ) : (
                <ClipStatusBadge status={clip.status} />
              )}
              <Badge>{clip.view === 'front' ? 'Front' : 'Side'}</Badge>
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
