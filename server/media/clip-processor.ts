import { createWriteStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { Clip } from '../entities/clip.entity';
import type { ObjectStorage } from '../storage/object-storage';
import { FfmpegError, MediaJobAborted } from './ffmpeg-run';
import { makePoster } from './poster';
import { countVideoPackets, oversizeReason, probeVideo, type VideoProbe } from './probe';
import { makeProxy, proxyReason } from './proxy';
import { makeThumbnailStrip } from './thumbnails';
import { repositoriesFor } from '../repositories/unit-of-work';

/** A failure the coach is shown as the clip's failure reason. */
export class ClipProcessingError extends Error {
  override name = 'ClipProcessingError';
}

export interface ClipProcessorDeps {
  dataSource: DataSource;
  storage: ObjectStorage;
  logger: Logger;
  /** Scratch folder for downloads and ffmpeg output; each job uses and removes its own subfolder. */
  workDir: string;
  /** Told once a clip is ready (the server then queues its pose analysis). */
  onReady?: (clipId: string) => Promise<void>;
}

export const derivativeKeys = (clip: Pick<Clip, 'clubId' | 'id'>) => {
  const base = `clubs/${clip.clubId}/clips/${clip.id}`;
  return {
    proxy: `${base}/playable.mp4`,
    poster: `${base}/poster.jpg`,
    thumbnails: `${base}/thumbnails.jpg`,
  };
};

/** Lines of ffmpeg output that say what is wrong with the file, rather than what ffmpeg did next. */
const TELLING =
  /invalid data|moov atom|no frame|not found|unsupported|unknown|truncated|corrupt|end of file|no video/i;

/**
 * One line for the coach from ffprobe/ffmpeg output: the first telling one, without decoder
 * prefixes ("[h264 @ 0x…]"), naming the file as the coach knows it rather than the scratch copy.
 */
export function describeMediaError(error: unknown, scratch: string, originalName: string): string {
  const raw =
    error instanceof FfmpegError
      ? error.detail
      : String((error as { stderr?: string }).stderr || (error as Error).message || error);
  const lines = raw
    .split('\n')
    .map((l) => l.replace(/^\[[^\]]*@ 0x[0-9a-f]+\]\s*/i, '').trim())
    .filter(Boolean);
  const line = lines.find((l) => TELLING.test(l)) ?? lines[lines.length - 1] ?? 'unknown error';
  return line.split(scratch).join(originalName).slice(0, 300);
}

/**
 * Probe, playable copy, poster and thumbnail strip for one clip; status processing -> ready, or
 * failed with a reason a coach can act on. An abort (server shutting down) leaves the clip in
 * "processing", so the next start picks it up again.
 */
/** Share of the stated frames that must be present (a few may be dropped by a phone's encoder). */
const COMPLETE_SHARE = 0.98;

/** Interrupted processing starts after which a clip fails instead of being resumed again. */
const MAX_INTERRUPTED_STARTS = 2;

export async function processClip(
  deps: ClipProcessorDeps,
  clipId: string,
  signal: AbortSignal,
): Promise<void> {
  const clip = await repositoriesFor(deps.dataSource.manager).clips.findById(clipId);
  if (!clip || (clip.status !== 'uploaded' && clip.status !== 'processing')) return;
  const clips = repositoriesFor(deps.dataSource.manager).clipMedia;
  // A start that never ended is a crash during this clip (a clean stop takes its start back below).
  // It is resumed once; a second such start fails it, so one clip cannot crash the server for ever.
  if (clip.processingStarts >= MAX_INTERRUPTED_STARTS) {
    await clips.update(clip.id, {
      status: 'failed',
      failureReason:
        'The server stopped twice while preparing this clip. Upload it again; if it fails again, export a shorter clip from the phone.',
    });
    deps.logger.warn({ clipId }, 'clip failed after interrupted processing');
    return;
  }
  await clips.update(clip.id, {
    status: 'processing',
    failureReason: null,
    processingStarts: clip.processingStarts + 1,
  });

  await fs.mkdir(deps.workDir, { recursive: true });
  const dir = await fs.mkdtemp(path.join(deps.workDir, `${clip.id}-`));
  const keys = derivativeKeys(clip);
  const stored: string[] = [];
  try {
    const original = path.join(dir, `original${path.extname(clip.storageKey)}`);
    await pipeline(await deps.storage.getStream(clip.storageKey), createWriteStream(original), { signal });

    let probe: VideoProbe | null;
    try {
      probe = await probeVideo(original);
    } catch (error) {
      throw new ClipProcessingError(
        `The file could not be read as video: ${describeMediaError(error, original, clip.originalName)}`,
      );
    }
    if (!probe) throw new ClipProcessingError('The file could not be read as video: it has no video stream');
    const oversize = oversizeReason(probe, clip.originalName);
    if (oversize) throw new ClipProcessingError(oversize);
    // The container's count against the packets really there: a copy cut short is refused whole, not
    // shown as a shorter clip than the coach filmed.
    const present = await countVideoPackets(original).catch(() => null);
    if (probe.frameCount !== null && present !== null && present < probe.frameCount * COMPLETE_SHARE) {
      throw new ClipProcessingError(
        `The file ends early: it lists ${probe.frameCount} frames but holds only ${present}, so the copy from the phone was cut short. Copy the clip from the phone again and upload it.`,
      );
    }

    let playable = original;
    let playableProbe = probe;
    const needsProxy = proxyReason(probe, clip.mimeType);
    if (needsProxy) {
      playable = path.join(dir, 'playable.mp4');
      try {
        await makeProxy(original, playable, probe, signal);
        playableProbe = (await probeVideo(playable)) ?? probe;
      } catch (error) {
        if (error instanceof MediaJobAborted) throw error;
        throw new ClipProcessingError(
          `The file could not be read as video: ${describeMediaError(error, original, clip.originalName)}`,
        );
      }
    }

    const durationMs = playableProbe.durationMs ?? probe.durationMs ?? 0;
    const poster = path.join(dir, 'poster.jpg');
    const strip = path.join(dir, 'thumbnails.jpg');
    let thumbnails;
    try {
      await makePoster(playable, poster, durationMs, signal);
      thumbnails = await makeThumbnailStrip(playable, strip, Math.max(durationMs, 1), signal);
    } catch (error) {
      if (error instanceof MediaJobAborted) throw error;
      throw new ClipProcessingError(
        `The file could not be read as video: ${describeMediaError(error, playable, clip.originalName)}`,
      );
    }

    if (needsProxy) {
      await deps.storage.putFile(keys.proxy, playable, 'video/mp4');
      stored.push(keys.proxy);
    }
    await deps.storage.putFile(keys.poster, poster, 'image/jpeg');
    stored.push(keys.poster);
    await deps.storage.putFile(keys.thumbnails, strip, 'image/jpeg');
    stored.push(keys.thumbnails);
    if (signal.aborted) throw new MediaJobAborted('stopped before the clip was marked ready');

    await clips.update(clip.id, {
      status: 'ready',
      failureReason: null,
      codec: probe.codec,
      rotation: probe.rotation,
      // Keypoints and the snow line live in the playable video's pixels.
      width: playableProbe.width,
      height: playableProbe.height,
      fps: probe.fps,
      frameCount: probe.frameCount,
      durationMs: probe.durationMs ?? playableProbe.durationMs,
      proxyKey: needsProxy ? keys.proxy : null,
      proxySizeBytes: needsProxy ? (await fs.stat(playable)).size : null,
      posterKey: keys.poster,
      thumbnailsKey: keys.thumbnails,
      thumbnails,
    });
    deps.logger.info(
      { clipId: clip.id, proxy: needsProxy, frames: probe.frameCount, codec: probe.codec },
      'clip processed',
    );
    await deps
      .onReady?.(clip.id)
      .catch((error: unknown) =>
        deps.logger.error({ err: error, clipId: clip.id }, 'could not queue the analysis of a ready clip'),
      );
  } catch (error) {
    await Promise.all(stored.map((key) => deps.storage.delete(key).catch(() => undefined)));
    if (error instanceof MediaJobAborted || signal.aborted) {
      // A clean shutdown is no crash: the next start begins this clip afresh.
      await clips.update(clip.id, { processingStarts: clip.processingStarts });
      throw new MediaJobAborted('clip processing stopped');
    }
    const reason =
      error instanceof ClipProcessingError
        ? error.message
        : 'The clip could not be processed because of a server error; it was logged';
    if (!(error instanceof ClipProcessingError))
      deps.logger.error({ err: error, clipId }, 'clip processing failed');
    await clips.update(clip.id, { status: 'failed', failureReason: reason });
  } finally {
    await fs.rm(dir, { recursive: true, force: true });
  }
}
