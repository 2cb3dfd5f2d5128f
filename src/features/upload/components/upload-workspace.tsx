import type { ReactNode } from 'react';
import { X } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useUploadQueue } from '../hooks/use-upload-queue';
import type { AthleteOption } from './athlete-picker';
import { DropZone } from './drop-zone';
import { UploadRow } from './upload-row';

export interface SessionOption {
  id: string;
  label: string;
}

interface UploadWorkspaceProps {
  sessions: SessionOption[];
  sessionId: string;
  onSessionChange: (id: string) => void;
  athletes: AthleteOption[];
  onUploaded: () => Promise<unknown>;
  /** Each uploaded clip with its file (the app analyses it on this computer). */
  onClipUploaded?: (clipId: string, file: File) => void;
  /** Where an uploaded clip's analysis on this computer stands, shown in its row. */
  renderClipStatus?: (clipId: string) => ReactNode;
  /** Shown above the list: the analysis on this computer, its pause and resume. */
  analysisControls?: ReactNode;
}

export function UploadWorkspace({
  sessions,
  sessionId,
  onSessionChange,
  athletes,
  onUploaded,
  onClipUploaded,
  renderClipStatus,
  analysisControls,
}: UploadWorkspaceProps) {
  const queue = useUploadQueue({ sessionId, onUploaded, onClipUploaded });
  const pending = queue.items.filter((item) => item.status === 'waiting');
  const done = queue.items.filter((item) => item.status === 'done').length;

  return (
    <div className="space-y-5">
      <SelectField
        label="Training session"
        className="max-w-xl"
        value={sessionId}
        disabled={queue.busy}
        hint={queue.busy ? 'Change the session once the running uploads finish.' : undefined}
        onChange={(event) => onSessionChange(event.target.value)}
      >
        <option value="">Choose a session…</option>
        {sessions.map((session) => (
          <option key={session.id} value={session.id}>
            {session.label}
          </option>
        ))}
      </SelectField>

      <DropZone onFiles={queue.addFiles} />

      {queue.rejected.map((rejected) => (
        <Notice key={rejected.id} tone="error">
          <span className="flex items-start justify-between gap-3">
            <span>{rejected.message}</span>
            <button
              type="button"
              aria-label="Dismiss"
              onClick={() => queue.dismissRejected(rejected.id)}
              className="rounded text-granite-600 hover:text-granite-900"
            >
              <X aria-hidden="true" className="h-4 w-4" />
            </button>
          </span>
        </Notice>
      ))}

      {analysisControls}

      {queue.items.length > 0 ? (
        <section aria-label="Clips to upload">
          <ul className="divide-y divide-granite-100 rounded-lg border border-granite-200 bg-white shadow-sm">
            {queue.items.map((item) => (
              <UploadRow
                key={item.id}
                item={item}
                athletes={athletes}
                onChange={(patch) => queue.update(item.id, patch)}
                onRetry={() => queue.enqueue([item.id])}
                onRemove={() => queue.remove(item.id)}
                clipStatus={item.clipId && renderClipStatus ? renderClipStatus(item.clipId) : null}
              />
            ))}
          </ul>
          <div className="mt-4 flex flex-wrap items-center justify-between gap-3">
            <p className="text-sm text-granite-600">
              {done} of {queue.items.length} uploaded. Each clip needs at least one athlete and its view.
            </p>
            <Button disabled={!sessionId || pending.length === 0} onClick={() => queue.enqueue()}>
              {pending.length > 1 ? `Upload ${pending.length} clips` : 'Upload clip'}
            </Button>
          </div>
          {!sessionId ? (
            <p className="mt-2 text-sm text-signal-700">Choose the training session first.</p>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}
