import { describe, expect, it } from 'vitest';
import { describeMediaError } from '@server/media/clip-processor';
import { FfmpegError } from '@server/media/ffmpeg-run';
import type { VideoProbe } from '@server/media/probe';
import { keyframeInterval, proxyReason } from '@server/media/proxy';
import { thumbnailPlan } from '@server/media/thumbnails';

const H264: VideoProbe = {
  codec: 'h264',
  rotation: 0,
  width: 1920,
  height: 1080,
  fps: 30,
  frameCount: 300,
  durationMs: 10_000,
  pixelFormat: 'yuv420p',
};

describe('when a playable copy is made', () => {
  it('not for what browsers play as stored: H.264 or VP9 in MP4 or WebM, upright, 8-bit 4:2:0', () => {
    expect(proxyReason(H264, 'video/mp4')).toBeNull();
    expect(proxyReason({ ...H264, codec: 'vp9' }, 'video/webm')).toBeNull();
    expect(proxyReason({ ...H264, codec: 'av1' }, 'video/mp4')).toBeNull();
  });

  it('for HEVC, MPEG-4 Part 2, QuickTime and Matroska files, rotated video and 10-bit pictures', () => {
    expect(proxyReason({ ...H264, codec: 'hevc' }, 'video/mp4')).toBe('codec hevc');
    expect(proxyReason({ ...H264, codec: 'mpeg4' }, 'video/x-msvideo')).toBe('codec mpeg4');
    expect(proxyReason(H264, 'video/quicktime')).toBe('container video/quicktime');
    expect(proxyReason(H264, 'video/x-matroska')).toBe('container video/x-matroska');
    expect(proxyReason({ ...H264, rotation: 90 }, 'video/mp4')).toBe('rotation 90°');
    expect(proxyReason({ ...H264, pixelFormat: 'yuv420p10le' }, 'video/mp4')).toBe(
      'pixel format yuv420p10le',
    );
  });

  it('with a keyframe every half second, rounded to whole frames', () => {
    // 25 × 0.5 = 12.5 → 13; 30 × 0.5 = 15; 59.94 × 0.5 = 29.97 → 30; unknown rate: as 30 fps.
    expect(keyframeInterval(25)).toBe(13);
    expect(keyframeInterval(30)).toBe(15);
    expect(keyframeInterval(59.94)).toBe(30);
    expect(keyframeInterval(null)).toBe(15);
    expect(keyframeInterval(1)).toBe(1);
  });
});

describe('thumbnail strip plan', () => {
  it('tiles every 250 ms for short clips, at most 100 tiles for long ones', () => {
    expect(thumbnailPlan(1)).toEqual({ count: 1, intervalMs: 250 });
    expect(thumbnailPlan(5680)).toEqual({ count: 23, intervalMs: 250 });
    // 60 s / 100 tiles = 600 ms, rounded up to a multiple of 250: 750 ms, so 60000 / 750 = 80 tiles.
    expect(thumbnailPlan(60_000)).toEqual({ count: 80, intervalMs: 750 });
    // 10 min: 6000 ms steps, exactly 100 tiles.
    expect(thumbnailPlan(600_000)).toEqual({ count: 100, intervalMs: 6000 });
  });
});

describe('failure reasons for coaches', () => {
  it('pick the line that says what is wrong, without decoder prefixes or scratch paths', () => {
    const detail = [
      '[h264 @ 0x41686ac0] Invalid NAL unit size (0 > 2711).',
      '[h264 @ 0x41686ac0] Error splitting the input into NAL units.',
      'Error while decoding stream #0:0: Invalid data found when processing input',
      'Error marking filters as finished',
    ].join('\n');
    expect(describeMediaError(new FfmpegError('x', detail), '/tmp/job/original.mp4', 'run3.mp4')).toBe(
      'Error while decoding stream #0:0: Invalid data found when processing input',
    );
    const probe = Object.assign(new Error('Command failed'), {
      stderr:
        '[mov,mp4,m4a,3gp,3g2,mj2 @ 0x1] moov atom not found\n/tmp/job/original.mp4: Invalid data found when processing input\n',
    });
    expect(describeMediaError(probe, '/tmp/job/original.mp4', 'run3.mp4')).toBe('moov atom not found');
    const pathOnly = Object.assign(new Error('x'), { stderr: '/tmp/job/original.mp4: Permission denied' });
    expect(describeMediaError(pathOnly, '/tmp/job/original.mp4', 'run3.mp4')).toBe(
      'run3.mp4: Permission denied',
    );
  });
});
