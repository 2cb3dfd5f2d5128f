import { conflict, forbidden } from '../errors';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { ObjectStorage } from '../storage/object-storage';
import type { AuditService } from './audit.service';
import type { ClipService } from './clip.service';
import type { Principal } from './principal';

/** What erasing needs to forget besides rows and objects: cached series of the clip. */
export interface ClipCaches {
  forgetClip(clipId: string): void;
}

/**
 * Erases one clip on request: its rows (frames, turns, flags, notes, reviews, baselines, stills and
 * snow lines, through the foreign keys), every object under its folder and the stills of it kept under
 * another clip's, and its cached series. What remains is an audit entry of who erased a clip, and when,
 * with no name and no id; earlier entries about the clip lose their details.
 */
export class ClipEraseService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly clips: ClipService,
    private readonly storage: ObjectStorage,
    private readonly caches: ClipCaches,
    private readonly audit: AuditService,
  ) {}

  async erase(principal: Principal, clipId: string): Promise<void> {
    const clip = await this.clips.findVisible(principal, clipId);
    const mayErase =
      principal.role === 'head_coach' ||
      (principal.role === 'coach' && clip.uploadedById === principal.user.id);
    if (!mayErase) throw forbidden('Only the head coach, or the coach who uploaded it, can delete this clip');
    if (clip.status === 'uploaded' || clip.status === 'processing')
      throw conflict('clip_busy', 'The server is still preparing this clip; delete it once it is ready');

    const stills = (await this.uow.repos.manager.query(
      `SELECT id, storageKey FROM compare_still WHERE clipAId = ? OR clipBId = ?`,
      [clip.id, clip.id],
    )) as { id: string; storageKey: string }[];
    const keys = new Set([
      ...(await this.storage.listKeys(`clubs/${clip.clubId}/clips/${clip.id}/`)),
      ...stills.map((s) => s.storageKey),
    ]);

    await this.uow.transaction(async (manager) => {
      // Reviews of other clips may have chosen a still of this one.
      for (const still of stills)
        await manager.query(`DELETE FROM review_item WHERE kind = 'still' AND refId = ?`, [still.id]);
      await manager.query(`DELETE FROM clip WHERE id = ?`, [clip.id]);
      // Earlier entries about the clip, or naming it in their details (a note on it), keep only who and when.
      await manager.query(
        `UPDATE audit_event SET targetId = NULL, details = NULL WHERE targetId = ? OR instr(details, ?) > 0`,
        [clip.id, clip.id],
      );
      await this.audit.record(manager, {
        clubId: principal.clubId,
        actorUserId: principal.user.id,
        action: 'clip.erase',
        targetType: 'clip',
      });
    });
    // Objects after the rows: a failure here leaves files of a clip with no row, which the storage
    // janitor sweeps by folder; the reverse would leave a clip pointing at missing files.
    for (const key of keys) await this.storage.delete(key);
    this.caches.forgetClip(clip.id);
  }
}
