import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { FileVideo, RotateCcw, Trash2 } from 'lucide-react';
import type { View } from '@shared/keypoints';
import { Button } from '@/components/ui/button';
import { ProgressBar } from '@/components/ui/progress-bar';
import { paths } from '@/config/paths';
import { formatBytes } from '@/lib/format';
import { useUploadedClipProgress } from '../api/clip-progress';
import type { UploadItem } from '../hooks/use-upload-queue';
import { AthletePicker, type AthleteOption } from './athlete-picker';

interface UploadRowProps {
  item: UploadItem;
  athletes: AthleteOption[];
  onChange: (patch: Partial<UploadItem>) => void;
  onRetry: () => void;
  onRemove: () => void;
  /** The uploaded clip's analysis on this computer (from the app). */
  clipStatus?: ReactNode;
}

function statusText(item: UploadItem): string {
  switch (item.status) {
    case 'waiting':
      return 'Not sent yet';
    case 'queued':
      return 'Waiting for a free slot';
    case 'uploading':
      return `Uploading ${Math.floor((item.loaded / Math.max(1, item.total)) * 100)} %`;
    case 'done':
      return 'Uploaded';
    case 'failed':
      return 'Upload failed';
  }
}

export function UploadRow({ item, athletes, onChange, onRetry, onRemove, clipStatus }: UploadRowProps) {
  const name = item.file.name;
  const locked = item.status === 'uploading' || item.status === 'queued' || item.status === 'done';
  const progress = item.status === 'done' ? 1 : item.loaded / Math.max(1, item.total);

  return (
    <li
      aria-label={name}
      className="grid gap-3 px-4 py-3 md:grid-cols-[minmax(0,14rem)_minmax(0,1fr)_7rem_minmax(0,13rem)_auto] md:items-center"
    >
      <div className="flex min-w-0 items-center gap-2.5">
        <FileVideo aria-hidden="true" className="h-5 w-5 shrink-0 text-glacier-500" />
        <div className="min-w-0">
          <p className="truncate text-sm font-medium text-granite-900" title={name}>
            {name}
          </p>
          <p className="text-xs text-granite-600">{formatBytes(item.file.size)}</p>
        </div>
      </div>
      <AthletePicker
        fileName={name}
        options={athletes}
        value={item.athleteIds}
        disabled={locked}
        onChange={(athleteIds) => onChange({ athleteIds, error: null })}
      />
      <select
        aria-label={`View of ${name}`}
        value={item.view}
        disabled={locked}
        onChange={(event) => onChange({ view: event.target.value as View })}
        className="h-8 rounded-md border border-granite-200 bg-white px-2 text-xs focus:outline-2 focus:outline-glacier-500 disabled:bg-granite-50"
      >
        <option value="side">Side view</option>
        <option value="front">Front view</option>
      </select>
      <div className="min-w-0">
        <ProgressBar
          label={`Upload progress of ${name}`}
          value={progress}
          tone={item.status === 'done' ? 'done' : item.status === 'failed' ? 'failed' : 'active'}
        />
        <p
          className={`mt-1 text-xs ${item.error ? 'font-medium text-alarm-600' : 'text-granite-600'}`}
          aria-live="polite"
        >
          {item.error ?? statusText(item)}
        </p>
        {item.status === 'done' && item.clipId ? <UploadedClipProgress clipId={item.clipId} /> : null}
        {clipStatus}
      </div>
      <div className="flex items-center justify-end gap-1">
        {item.status === 'done' && item.clipId ? (
          <Link
            to={paths.clip.href(item.clipId)}
            className="text-sm font-medium text-glacier-700 hover:underline"
          >
            Open clip
          </Link>
        ) : null}
        {item.status === 'failed' ? (
          <Button
            variant="quiet"
            size="sm"
            onClick={onRetry}
            icon={<RotateCcw aria-hidden="true" className="h-4 w-4" />}
            aria-label={`Retry ${name}`}
          >
            Retry
          </Button>
        ) : null}
        {item.status !== 'done' ? (
          <Button variant="quiet" size="sm" onClick={onRemove} aria-label={`Remove ${name}`}>
            <Trash2 aria-hidden="true" className="h-4 w-4" />
          </Button>
        ) : null}
      </div>
    </li>
  );
}

/** After the upload: the clip being prepared, then analysed on the server in the background. */
function UploadedClipProgress({ clipId }: { clipId: string }) {
  const progress = useUploadedClipProgress(clipId);
  const data = progress.data;
  let text: string;
  if (!data) text = progress.isError ? 'Could not check the clip; open it to see where it stands' : '';
  else if (data.clipStatus === 'uploaded' || data.clipStatus === 'processing')
    text = 'Preparing the clip for playback…';
  else if (data.clipStatus === 'failed') text = 'The clip could not be prepared; open it to see why';
  else if (data.serverAnalysis?.status === 'running') {
    const { done, total } = data.serverAnalysis;
    text = `Analysing on the server ${total > 0 ? Math.round((done / total) * 100) : 0} %`;
  } else if (data.serverAnalysis?.status === 'queued')
    text =
      data.serverAnalysis.heldUntil && Date.parse(data.serverAnalysis.heldUntil) > Date.now()
        ? 'The server waits while this computer analyses it'
        : 'Queued for analysis on the server';
  else if (data.serverAnalysis?.status === 'failed')
    text = `Analysis failed: ${data.serverAnalysis.error ?? 'open the clip to try again'}`;
  else if (data.frameCount !== null && data.storedFrames >= data.frameCount) text = 'Analysed';
  else text = 'Ready; open it to analyse';
  return (
    <p className="mt-0.5 text-xs text-granite-600" aria-live="polite" data-testid="clip-progress">
      {text}
    </p>
  );
}
