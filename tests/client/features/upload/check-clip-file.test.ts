import { describe, expect, it } from 'vitest';
import { MAX_CLIP_BYTES_DEFAULT } from '@shared/schemas/clip.schema';
import { checkClipFile } from '@/features/upload/utils/check-clip-file';

const file = (name: string, type: string, size = 1000) => ({ name, type, size });

describe('checkClipFile', () => {
  it.each([
    ['run-1.mp4', 'video/mp4'],
    ['RUN-2.MOV', 'video/quicktime'],
    ['gate-drill.webm', 'video/webm'],
    ['old-cam.avi', 'video/x-msvideo'],
    ['phone.mkv', ''],
    ['export.m4v', 'application/octet-stream'],
  ])('accepts %s', (name, type) => {
    expect(checkClipFile(file(name, type))).toBeNull();
  });

  it.each([
    ['lap-times.txt', 'text/plain'],
    ['photo.jpg', 'image/jpeg'],
    ['no-extension', ''],
    ['renamed.mp4', 'image/png'],
  ])('refuses %s as not a video', (name, type) => {
    expect(checkClipFile(file(name, type))).toMatch(
      /is not a video clip\. Stanceline takes MP4, MOV, M4V, WebM, AVI or MKV/,
    );
  });

  it('refuses an empty file', () => {
    expect(checkClipFile(file('empty.mp4', 'video/mp4', 0))).toMatch(/empty \(0 bytes\)/);
  });

  it('refuses a file over the limit and keeps one exactly at it', () => {
    expect(checkClipFile(file('long.mp4', 'video/mp4', MAX_CLIP_BYTES_DEFAULT))).toBeNull();
    expect(checkClipFile(file('long.mp4', 'video/mp4', MAX_CLIP_BYTES_DEFAULT + 1))).toMatch(
      /over the 2\.1 GB limit/,
    );
    expect(checkClipFile(file('small.mp4', 'video/mp4', 2001), 2000)).toMatch(/2 kB, over the 2 kB limit/);
  });
});
