import { ALL_FORMATS, BlobSource, Input, UrlSource, VideoSampleSink, type VideoSample } from 'mediabunny';
import type { FrameSource } from './frame-grabber';

/** WebCodecs cannot read this file here (no VideoDecoder, no decoder for its codec, or a rotated track). */
export class WebCodecsUnavailableError extends Error {
  override name = 'WebCodecsUnavailableError';
}

function abortError(): DOMException {
  return new DOMException('Analysis cancelled', 'AbortError');
}

/**
 * Frames of a clip decoded in order with WebCodecs (mediabunny demuxes the file, the browser's
 * VideoDecoder decodes it): the k-th decoded frame is frame k, so the numbering is exact by
 * construction, with no seeking. Frames come as ImageBitmaps the pose worker takes over without a copy.
 */
export class DecodedFrameSource implements FrameSource {
  readonly kind = 'webcodecs' as const;
  mismatches = 0;
  private input: Input | null = null;
  private sink: VideoSampleSink | null = null;
  private samples: AsyncGenerator<VideoSample, void, unknown> | null = null;
  /** Index of the frame the sample iterator yields next. */
  private nextIndex = 0;

  /** The clip's media address, or the file itself (a clip just uploaded from this computer). */
  constructor(private readonly src: string | Blob) {}

  async open(signal: AbortSignal): Promise<void> {
    if (typeof VideoDecoder === 'undefined')
      throw new WebCodecsUnavailableError('this browser has no WebCodecs');
    const input = new Input({
      // A file that cannot be read fails at once instead of being retried.
      source:
        typeof this.src === 'string'
          ? new UrlSource(new URL(this.src, window.location.href), { getRetryDelay: () => null })
          : new BlobSource(this.src),
      formats: ALL_FORMATS,
    });
    this.input = input;
    let track;
    try {
      track = await input.getPrimaryVideoTrack();
    } catch (error) {
      throw new WebCodecsUnavailableError(`the file could not be read here (${(error as Error).message})`);
    }
    if (signal.aborted) throw abortError();
    if (!track) throw new WebCodecsUnavailableError('the file has no video track');
    if (!(await track.canDecode()))
      throw new WebCodecsUnavailableError(
        `no WebCodecs decoder for ${(await track.getCodec()) ?? 'this codec'}`,
      );
    // The video element turns a rotated track upright; the decoder does not, so such files are grabbed.
    if ((await track.getRotation()) !== 0) throw new WebCodecsUnavailableError('the video track is rotated');
    this.sink = new VideoSampleSink(track);
    this.restart();
  }

  private restart(): void {
    void this.samples?.return();
    this.samples = this.sink!.samples();
    this.nextIndex = 0;
  }

  async grab(frameIndex: number, signal: AbortSignal): Promise<ImageBitmap> {
    if (!this.samples) throw new Error('the frame decoder is not open');
    if (frameIndex < this.nextIndex) this.restart();
    for (;;) {
      if (signal.aborted) throw abortError();
      const next = await this.samples.next();
      if (next.done) throw new Error(`the video ends before frame ${frameIndex}`);
      const index = this.nextIndex++;
      const sample = next.value;
      if (index < frameIndex) {
        sample.close();
        continue;
      }
      const frame = sample.toVideoFrame();
      sample.close();
      try {
        return await createImageBitmap(frame);
      } finally {
        frame.close();
      }
    }
  }

  close(): void {
    void this.samples?.return();
    this.samples = null;
    this.input?.dispose();
    this.input = null;
  }
}
