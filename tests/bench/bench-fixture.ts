// What the server-side benchmarks share: the app on a real port with the demo club, one processed
// front-view clip of Elsie (U14) to copy, the synthetic skier's frames, and health-read latencies.
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { performance } from 'node:perf_hooks';
import { computeFrameMetrics } from '@shared/metrics';
import type { SeriesFrameInput } from '@shared/series';
import type { FrameResult } from '@server/entities/frame-result.entity';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from '../server/clip-fixtures';

export interface BenchFixture {
  server: TestServer;
  /** http://127.0.0.1:port of the app. */
  base: string;
  elsie: string;
  /** A processed clip of `framesPerClip` frames, no stored frames yet. */
  templateId: string;
  /** The synthetic skier: ±25° of lean every 1.6 s, legs at 0.85, shoulders 6° off level. */
  frames: SeriesFrameInput[];
  /** The frames as stored rows of a clip, metrics measured by shared/metrics. */
  frameRows(clipId: string): FrameResult[];
  close(): Promise<void>;
}

export async function startBenchFixture(framesPerClip: number, fps: number): Promise<BenchFixture> {
  const server = await createTestServer();
  const http = server.app.listen(0, '127.0.0.1');
  await new Promise((r) => http.once('listening', r));
  const base = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
  const [sessionId] = await server.sessionIds();
  const elsie = await server.athleteId('Elsie');
  const video = await renderVideo('h264-mp4', { seconds: framesPerClip / fps, fps, width: 160, height: 120 });
  const template = await settled(
    server,
    (await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' })).id,
  );
  const frames = syntheticClip(framesPerClip, fps, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: 0.85,
    shoulderTiltDeg: 6,
  }));
  const measured = frames.map((f) => computeFrameMetrics({ keypoints: f.keypoints, view: 'front' }));
  return {
    server,
    base,
    elsie,
    templateId: template.id,
    frames,
    frameRows(clipId) {
      const now = new Date();
      return frames.map((f, i) => ({
        id: randomUUID(),
        clipId,
        frameIndex: f.frameIndex,
        timeMs: f.timeMs,
        model: 'lightning',
        keypoints: f.keypoints,
        metrics: measured[i].metrics,
        reasons: measured[i].reasons as Record<string, string>,
        corrected: false,
        careful: false,
        createdAt: now,
        updatedAt: now,
      }));
    },
    async close() {
      http.close();
      await server.close();
      await removeRenderedVideos();
    },
  };
}

/** Health reads (a database query and an S3 ping) every `gapMs` until `until()`; sorted times in ms. */
export async function healthLatencies(base: string, until: () => boolean, gapMs = 10): Promise<number[]> {
  const times: number[] = [];
  while (!until()) {
    const t = performance.now();
    await (await fetch(`${base}/api/health`)).arrayBuffer();
    times.push(performance.now() - t);
    await new Promise((r) => setTimeout(r, gapMs));
  }
  return times.sort((a, b) => a - b);
}

export const quantile = (sorted: number[], q: number) =>
  sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];

/** "p50 / p99 / max ms (n reads)" of sorted latencies. */
export const latencySummary = (sorted: number[]) =>
  `${quantile(sorted, 0.5).toFixed(1)} / ${quantile(sorted, 0.99).toFixed(1)} / ${sorted[sorted.length - 1].toFixed(1)} ms (${sorted.length} reads)`;
