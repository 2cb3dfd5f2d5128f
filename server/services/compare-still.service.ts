import { randomUUID } from 'node:crypto';
import type { CompareStillDto, CompareStillInput } from '@shared/schemas/plan.schema';
import { MAX_COMPARE_STILL_BYTES } from '@shared/schemas/plan.schema';
import type { CompareStill } from '../entities/compare-still.entity';
import { badRequest, forbidden, HttpError, notFound } from '../errors';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { ObjectStorage } from '../storage/object-storage';
import type { ClipService } from './clip.service';
import type { Clock, Principal } from './principal';

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
/** Two 4K frames side by side is the largest still that makes sense. */
const MAX_SIDE = 8192;

/** Width and height from a PNG's IHDR chunk, or null when the bytes are not a PNG. */
function pngSize(bytes: Buffer): { width: number; height: number } | null {
  if (bytes.length < 24 || !bytes.subarray(0, 8).equals(PNG_SIGNATURE)) return null;
  if (bytes.subarray(12, 16).toString('latin1') !== 'IHDR') return null;
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

/** Stills of two clips' frames side by side, kept with the pair for a review; readable by whoever sees both. */
export class CompareStillService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly clips: ClipService,
    private readonly storage: ObjectStorage,
    private readonly clock: Clock,
  ) {}

  async save(principal: Principal, input: CompareStillInput): Promise<CompareStillDto> {
    if (principal.role !== 'head_coach' && principal.role !== 'coach')
      throw forbidden('Only coaches and the head coach keep stills with a clip pair');
    if (input.clipAId === input.clipBId)
      throw badRequest('same_clip', 'Choose two different clips to keep a side-by-side still');
    const [a] = await Promise.all([
      this.clips.findVisible(principal, input.clipAId),
      this.clips.findVisible(principal, input.clipBId),
    ]);
    const bytes = Buffer.from(input.png.slice(input.png.indexOf(',') + 1), 'base64');
    const size = pngSize(bytes);
    if (!size || size.width === 0 || size.height === 0)
      throw badRequest('not_png', 'The still is not a PNG image; save it again from Compare');
    if (size.width > MAX_SIDE || size.height > MAX_SIDE || bytes.length > MAX_COMPARE_STILL_BYTES)
      throw new HttpError(413, 'too_large', 'The still is larger than 6 MB or 8192 pixels a side');
    const id = randomUUID();
    const still: CompareStill = {
      id,
      clubId: principal.clubId,
      clipAId: input.clipAId,
      clipBId: input.clipBId,
      frameA: input.frameA,
      frameB: input.frameB,
      caption: input.caption,
      // Under clip A's folder, so erasing the clip takes the still with it.
      storageKey: `clubs/${principal.clubId}/clips/${a.id}/compare/${id}.png`,
      byteSize: bytes.length,
      createdById: principal.user.id,
      createdAt: this.clock.now(),
    };
    await this.storage.putBuffer(still.storageKey, bytes, 'image/png');
    try {
      await this.uow.repos.plans.insertStill(still);
    } catch (error) {
      await this.storage.delete(still.storageKey).catch(() => undefined);
      throw error;
    }
    return (await this.toDtos([still]))[0];
  }

  async list(principal: Principal, clipA: string, clipB: string): Promise<CompareStillDto[]> {
    await Promise.all([this.clips.findVisible(principal, clipA), this.clips.findVisible(principal, clipB)]);
    return this.toDtos(await this.uow.repos.plans.listStills(clipA, clipB));
  }

  async image(principal: Principal, id: string): Promise<CompareStill> {
    const still = await this.uow.repos.plans.findStill(id);
    if (!still || still.clubId !== principal.clubId) throw notFound('Still');
    await Promise.all([
      this.clips.findVisible(principal, still.clipAId),
      this.clips.findVisible(principal, still.clipBId),
    ]).catch(() => {
      throw notFound('Still');
    });
    return still;
  }

  private async toDtos(stills: CompareStill[]): Promise<CompareStillDto[]> {
    const names = await this.uow.repos.users.namesByIds(
      stills.flatMap((s) => (s.createdById ? [s.createdById] : [])),
    );
    return stills.map((s) => ({
      id: s.id,
      clipAId: s.clipAId,
      clipBId: s.clipBId,
      frameA: s.frameA,
      frameB: s.frameB,
      caption: s.caption,
      createdAt: s.createdAt.toISOString(),
      createdBy: s.createdById ? (names.get(s.createdById) ?? null) : null,
    }));
  }
}
