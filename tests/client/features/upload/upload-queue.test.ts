import { describe, expect, it } from 'vitest';
import { nextToStart, uploadQueueReducer, type UploadItem } from '@/features/upload/hooks/use-upload-queue';

function item(id: string, status: UploadItem['status']): UploadItem {
  return {
    id,
    file: new File(['x'], `${id}.mp4`, { type: 'video/mp4' }),
    athleteIds: [],
    view: 'side',
    status,
    loaded: 0,
    total: 1,
    error: null,
    clipId: null,
  };
}

describe('upload queue', () => {
  it('starts queued files oldest first, at most two at a time', () => {
    const items = [item('a', 'queued'), item('b', 'queued'), item('c', 'queued')];
    expect(nextToStart(items).map((i) => i.id)).toEqual(['a', 'b']);
  });

  it('fills only the free slot while one upload runs', () => {
    const items = [item('a', 'done'), item('b', 'uploading'), item('c', 'queued'), item('d', 'queued')];
    expect(nextToStart(items).map((i) => i.id)).toEqual(['c']);
  });

  it('starts nothing when both slots are busy or nothing is queued', () => {
    expect(nextToStart([item('a', 'uploading'), item('b', 'uploading'), item('c', 'queued')])).toEqual([]);
    expect(nextToStart([item('a', 'waiting'), item('b', 'failed')])).toEqual([]);
  });

  it('updates and removes one row without touching the others', () => {
    const start = { items: [item('a', 'waiting'), item('b', 'waiting')], rejected: [] };
    const updated = uploadQueueReducer(start, { type: 'update', id: 'b', patch: { view: 'front' } });
    expect(updated.items.map((i) => i.view)).toEqual(['side', 'front']);
    const removed = uploadQueueReducer(updated, { type: 'remove', id: 'a' });
    expect(removed.items.map((i) => i.id)).toEqual(['b']);
  });
});
