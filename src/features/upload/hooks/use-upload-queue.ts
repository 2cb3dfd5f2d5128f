import { useCallback, useEffect, useReducer, useRef } from 'react';
import { uploadClipFieldsSchema } from '@shared/schemas/clip.schema';
import type { View } from '@shared/keypoints';
import { errorMessage } from '@/lib/api-client';
import { uploadClip } from '../api/upload-clip';
import { checkClipFile } from '../utils/check-clip-file';

export type UploadStatus = 'waiting' | 'queued' | 'uploading' | 'done' | 'failed';

export interface UploadItem {
  id: string;
  file: File;
  athleteIds: string[];
  view: View;
  status: UploadStatus;
  loaded: number;
  total: number;
  error: string | null;
  clipId: string | null;
}

export interface RejectedFile {
  id: string;
  message: string;
}

interface State {
  items: UploadItem[];
  rejected: RejectedFile[];
}

type Action =
  | { type: 'add'; items: UploadItem[]; rejected: RejectedFile[] }
  | { type: 'remove'; id: string }
  | { type: 'dismiss-rejected'; id: string }
  | { type: 'update'; id: string; patch: Partial<UploadItem> };

/** Two files at a time keeps a coach's uplink busy without starving either upload. */
export const UPLOAD_CONCURRENCY = 2;

let nextId = 0;
const newId = () => `upload-${Date.now()}-${nextId++}`;

export function uploadQueueReducer(state: State, action: Action): State {
  switch (action.type) {
    case 'add':
      return { items: [...state.items, ...action.items], rejected: [...state.rejected, ...action.rejected] };
    case 'remove':
      return { ...state, items: state.items.filter((item) => item.id !== action.id) };
    case 'dismiss-rejected':
      return { ...state, rejected: state.rejected.filter((r) => r.id !== action.id) };
    case 'update':
      return {
        ...state,
        items: state.items.map((item) => (item.id === action.id ? { ...item, ...action.patch } : item)),
      };
  }
}

/** Items the scheduler should start now, oldest first, without exceeding the concurrency limit. */
export function nextToStart(items: UploadItem[], limit = UPLOAD_CONCURRENCY): UploadItem[] {
  const running = items.filter((item) => item.status === 'uploading').length;
  return items.filter((item) => item.status === 'queued').slice(0, Math.max(0, limit - running));
}

interface UseUploadQueueOptions {
  sessionId: string;
  defaultAthleteIds?: string[];
  onUploaded?: () => Promise<unknown> | void;
  /** Told of each clip uploaded, with its file (to analyse it on this computer). */
  onClipUploaded?: (clipId: string, file: File) => void;
}

const NO_ATHLETES: string[] = [];

export function useUploadQueue({
  sessionId,
  defaultAthleteIds = NO_ATHLETES,
  onUploaded,
  onClipUploaded,
}: UseUploadQueueOptions) {
  const [state, dispatch] = useReducer(uploadQueueReducer, { items: [], rejected: [] });
  const controllers = useRef(new Map<string, AbortController>());
  const onUploadedRef = useRef(onUploaded);
  const onClipUploadedRef = useRef(onClipUploaded);
  useEffect(() => {
    onUploadedRef.current = onUploaded;
    onClipUploadedRef.current = onClipUploaded;
  }, [onUploaded, onClipUploaded]);

  const addFiles = useCallback(
    (files: Iterable<File>) => {
      const items: UploadItem[] = [];
      const rejected: RejectedFile[] = [];
      for (const file of files) {
        const problem = checkClipFile(file);
        if (problem) rejected.push({ id: newId(), message: problem });
        else
          items.push({
            id: newId(),
            file,
            athleteIds: [...defaultAthleteIds],
            view: 'side',
            status: 'waiting',
            loaded: 0,
            total: file.size,
            error: null,
            clipId: null,
          });
      }
      dispatch({ type: 'add', items, rejected });
    },
    [defaultAthleteIds],
  );

  const update = useCallback(
    (id: string, patch: Partial<UploadItem>) => dispatch({ type: 'update', id, patch }),
    [],
  );

  const remove = useCallback((id: string) => {
    controllers.current.get(id)?.abort();
    controllers.current.delete(id);
    dispatch({ type: 'remove', id });
  }, []);

  /** Checks each row against the same schema the server uses; valid rows join the queue. */
  const enqueue = useCallback(
    (ids?: string[]) => {
      for (const item of state.items) {
        if (ids && !ids.includes(item.id)) continue;
        if (item.status !== 'waiting' && item.status !== 'failed') continue;
        const parsed = uploadClipFieldsSchema.safeParse({
          sessionId,
          athleteIds: item.athleteIds,
          view: item.view,
        });
        if (parsed.success) update(item.id, { status: 'queued', error: null, loaded: 0 });
        else update(item.id, { error: parsed.error.issues[0]?.message ?? 'Check this row.' });
      }
    },
    [state.items, sessionId, update],
  );

  useEffect(() => {
    for (const item of nextToStart(state.items)) {
      const controller = new AbortController();
      controllers.current.set(item.id, controller);
      update(item.id, { status: 'uploading', loaded: 0 });
      uploadClip(
        { file: item.file, sessionId, athleteIds: item.athleteIds, view: item.view },
        {
          signal: controller.signal,
          onProgress: (loaded, total) => update(item.id, { loaded, total }),
        },
      )
        .then(async (response) => {
          update(item.id, { status: 'done', loaded: item.file.size, clipId: response.clip.id });
          onClipUploadedRef.current?.(response.clip.id, item.file);
          await onUploadedRef.current?.();
        })
        .catch((error: unknown) => {
          if (controller.signal.aborted) return;
          update(item.id, { status: 'failed', error: errorMessage(error) });
        })
        .finally(() => controllers.current.delete(item.id));
    }
  }, [state.items, sessionId, update]);

  // Leaving the page would cut running uploads; let the browser ask first.
  const busy = state.items.some((item) => item.status === 'uploading' || item.status === 'queued');
  useEffect(() => {
    if (!busy) return;
    const warn = (event: BeforeUnloadEvent) => event.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [busy]);

  useEffect(() => {
    const running = controllers.current;
    return () => running.forEach((controller) => controller.abort());
  }, []);

  return {
    items: state.items,
    rejected: state.rejected,
    busy,
    addFiles,
    update,
    remove,
    enqueue,
    dismissRejected: (id: string) => dispatch({ type: 'dismiss-rejected', id }),
  };
}
