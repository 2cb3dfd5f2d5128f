import type { Clip } from '../entities/clip.entity';
import { HttpError } from '../errors';
import type { ClipService } from './clip.service';
import type { Principal } from './principal';

export type ClipImageKind = 'poster' | 'thumbnails';

/** Poster and thumbnail strip of a clip, under the same access rules as its video. */
export class ClipImageService {
  constructor(private readonly clips: ClipService) {}

  async target(
    principal: Principal,
    clipId: string,
    kind: ClipImageKind,
  ): Promise<{ clip: Clip; key: string }> {
    const clip = await this.clips.findVisible(principal, clipId);
    const key = kind === 'poster' ? clip.posterKey : clip.thumbnailsKey;
    if (!key) {
      const what = kind === 'poster' ? 'poster frame' : 'thumbnail strip';
      const why =
        clip.status === 'failed'
          ? `the clip could not be processed: ${clip.failureReason ?? 'no reason recorded'}`
          : 'the clip is still being processed';
      throw new HttpError(404, 'not_ready', `There is no ${what} yet: ${why}`);
    }
    return { clip, key };
  }
}
