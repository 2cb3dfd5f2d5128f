import { EntitySchema } from 'typeorm';
import type { AthletePick, PoseModelName, SkierFacing } from '@shared/keypoints';
import type { ClipStatus, CLIP_VIEWS } from '@shared/schemas/clip.schema';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

export interface Clip {
  id: string;
  clubId: string;
  sessionId: string;
  uploadedById: string | null;
  view: (typeof CLIP_VIEWS)[number];
  /** Front view: the skier faces the camera ('toward') or was filmed from behind ('away'). */
  facing: SkierFacing;
  /** The athlete the coach picked among several people, followed from that frame on; null: whoever the model finds. */
  athletePick: AthletePick | null;
  status: ClipStatus;
  failureReason: string | null;
  originalName: string;
  mimeType: string;
  sizeBytes: number;
  /** Hex SHA-256 of the original, computed while it streamed in. */
  sha256: string;
  /** Object keys in the clip bucket. */
  storageKey: string;
  proxyKey: string | null;
  /** Byte size of the playable copy, for Range answers without asking the store. */
  proxySizeBytes: number | null;
  posterKey: string | null;
  thumbnailsKey: string | null;
  /** Layout of the thumbnail sprite (see ThumbnailStripDto), null until it is made. */
  thumbnails: ThumbnailLayout | null;
  /** Rotation of the original in degrees (display matrix); the playable copy has it applied. */
  rotation: number;
  defaultModel: PoseModelName;
  codec: string | null;
  width: number | null;
  height: number | null;
  fps: number | null;
  frameCount: number | null;
  durationMs: number | null;
  /** Times processing began and was not finished or stopped cleanly (a crash); the second one fails it. */
  processingStarts: number;
  createdAt: Date;
}

export interface ThumbnailLayout {
  count: number;
  tileWidth: number;
  tileHeight: number;
  columns: number;
  intervalMs: number;
}

export const ClipEntity = new EntitySchema<Clip>({
  name: 'Clip',
  tableName: 'clip',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    sessionId: uuidColumn,
    uploadedById: nullableUuidColumn,
    view: { type: 'varchar', length: 10 },
    facing: { type: 'varchar', length: 6, default: 'toward' },
    athletePick: { type: 'simple-json', nullable: true },
    status: { type: 'varchar', length: 20 },
    failureReason: { type: 'text', nullable: true },
    originalName: { type: 'varchar', length: 255 },
    mimeType: { type: 'varchar', length: 100 },
    sizeBytes: { type: 'integer' },
    sha256: { type: 'varchar', length: 64 },
    storageKey: { type: 'varchar', length: 255 },
    proxyKey: { type: 'varchar', length: 255, nullable: true },
    proxySizeBytes: { type: 'integer', nullable: true },
    posterKey: { type: 'varchar', length: 255, nullable: true },
    thumbnailsKey: { type: 'varchar', length: 255, nullable: true },
    thumbnails: { type: 'simple-json', nullable: true },
    rotation: { type: 'integer', default: 0 },
    defaultModel: { type: 'varchar', length: 20, default: 'lightning' },
    codec: { type: 'varchar', length: 40, nullable: true },
    width: { type: 'integer', nullable: true },
    height: { type: 'integer', nullable: true },
    fps: { type: 'real', nullable: true },
    frameCount: { type: 'integer', nullable: true },
    durationMs: { type: 'integer', nullable: true },
    processingStarts: { type: 'integer', default: 0 },
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('TrainingSession', 'sessionId', 'RESTRICT'),
    foreignKey('User', 'uploadedById', 'SET NULL'),
  ],
  indices: [
    { name: 'IDX_clip_session', columns: ['sessionId'] },
    { name: 'IDX_clip_sha256', columns: ['sha256'] },
    { name: 'IDX_clip_status', columns: ['status'] },
  ],
});
