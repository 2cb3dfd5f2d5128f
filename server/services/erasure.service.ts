import type { EntityManager } from 'typeorm';
import type { Clip } from '../entities/clip.entity';
import { conflict, forbidden, notFound } from '../errors';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { ObjectStorage } from '../storage/object-storage';
import type { AuditService } from './audit.service';
import type { ClipService } from './clip.service';
import type { Principal } from './principal';

/** What erasing needs to forget besides rows and objects: cached series of a clip. */
export interface ClipCaches {
  forgetClip(clipId: string): void;
}

/**
 * Erasure on request. A clip: its rows (frames, turns, flags, notes, reviews, baselines, stills and snow
 * lines, through the foreign keys), every object under its folder and the stills of it kept under
 * another clip's, and its cached series. An athlete: every clip that shows them, their record, plan,
 * reviews, consent, their own account, and guardian accounts that were there only for them. What
 * remains is an audit entry of who erased what kind of record, and when, with no name and no id;
 * earlier entries about what was erased lose their target and details.
 */
export class ErasureService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly clips: ClipService,
    private readonly storage: ObjectStorage,
    private readonly caches: ClipCaches,
    private readonly audit: AuditService,
  ) {}

  async eraseClip(principal: Principal, clipId: string): Promise<void> {
    const clip = await this.clips.findVisible(principal, clipId);
    const mayErase =
      principal.role === 'head_coach' ||
      (principal.role === 'coach' && clip.uploadedById === principal.user.id);
    if (!mayErase) throw forbidden('Only the head coach, or the coach who uploaded it, can delete this clip');
    this.refuseBusy([clip]);
    const keys = await this.objectKeys([clip]);
    await this.uow.transaction(async (manager) => {
      await this.eraseClipRows(manager, clip);
      await this.record(manager, principal, 'clip.erase', 'clip');
    });
    await this.removeObjects(keys, [clip]);
  }

  async eraseAthlete(principal: Principal, athleteId: string): Promise<{ clips: number }> {
    if (principal.role !== 'head_coach') throw forbidden('Only the head coach erases an athlete');
    const repos = this.uow.repos;
    const athlete = await repos.athletes.findById(athleteId);
    if (!athlete || athlete.clubId !== principal.clubId) throw notFound('Athlete');
    const clipIds = (
      (await repos.manager.query(`SELECT clipId FROM clip_athlete WHERE athleteId = ?`, [athlete.id])) as {
        clipId: string;
      }[]
    ).map((r) => r.clipId);
    const clips = await repos.clips.findByIds(clipIds);
    this.refuseBusy(clips);
    const guardians = await repos.athletes.guardiansOf(athlete.id);
    const keys = await this.objectKeys(clips);
    await this.uow.transaction(async (manager) => {
      for (const clip of clips) await this.eraseClipRows(manager, clip);
      // Guardians who were members only for this athlete go with them; a parent of a sibling stays.
      const leaving: { id: string; email: string }[] = [];
      for (const g of guardians) {
        const [{ n }] = (await manager.query(
          `SELECT COUNT(*) AS n FROM guardian_link WHERE guardianUserId = ? AND athleteId != ?`,
          [g.id, athlete.id],
        )) as { n: number }[];
        if (Number(n) === 0) leaving.push({ id: g.id, email: g.email });
      }
      const own = athlete.userId
        ? ((await manager.query(`SELECT id, email FROM user WHERE id = ?`, [athlete.userId])) as {
            id: string;
            email: string;
          }[])
        : [];
      await manager.query(`DELETE FROM athlete WHERE id = ?`, [athlete.id]);
      for (const user of [...own, ...leaving]) {
        await manager.query(`DELETE FROM user WHERE id = ?`, [user.id]);
        await manager.query(`DELETE FROM invitation WHERE email = ?`, [user.email]);
        await manager.query(`DELETE FROM rate_limit_hit WHERE instr(key, ?) > 0`, [user.email]);
        await this.scrubAudit(manager, user.id);
      }
      await this.scrubAudit(manager, athlete.id);
      await this.record(manager, principal, 'athlete.erase', 'athlete');
    });
    await this.removeObjects(keys, clips);
    return { clips: clips.length };
  }

  /**
   * Erases clips with no member acting: the privacy sweep after a withdrawal's grace period or past
   * the club's retention. Clips still being prepared are left for the next sweep. Returns the ids erased.
   */
  async eraseClipsBySweep(clubId: string, clipIds: string[], action: string): Promise<string[]> {
    const clips = (await this.uow.repos.clips.findByIds(clipIds)).filter(
      (c) => c.clubId === clubId && c.status !== 'uploaded' && c.status !== 'processing',
    );
    if (clips.length === 0) return [];
    const keys = await this.objectKeys(clips);
    await this.uow.transaction(async (manager) => {
      for (const clip of clips) await this.eraseClipRows(manager, clip);
      await this.audit.record(manager, {
        clubId,
        actorUserId: null,
        action,
        targetType: 'clip',
        details: { clips: clips.length },
      });
    });
    await this.removeObjects(keys, clips);
    return clips.map((c) => c.id);
  }

  private refuseBusy(clips: Clip[]): void {
    if (clips.some((c) => c.status === 'uploaded' || c.status === 'processing'))
      throw conflict('clip_busy', 'The server is still preparing a clip; erase once it is ready');
  }

  /** Every object of the clips' folders, and stills of them kept under another clip's folder. */
  private async objectKeys(clips: Clip[]): Promise<Set<string>> {
    const keys = new Set<string>();
    for (const clip of clips) {
      for (const key of await this.storage.listKeys(`clubs/${clip.clubId}/clips/${clip.id}/`)) keys.add(key);
      const stills = (await this.uow.repos.manager.query(
        `SELECT storageKey FROM compare_still WHERE clipAId = ? OR clipBId = ?`,
        [clip.id, clip.id],
      )) as { storageKey: string }[];
      for (const s of stills) keys.add(s.storageKey);
    }
    return keys;
  }

  private async eraseClipRows(manager: EntityManager, clip: Clip): Promise<void> {
    // Reviews of other clips may have chosen a still of this one.
    await manager.query(
      `DELETE FROM review_item WHERE kind = 'still' AND refId IN
         (SELECT id FROM compare_still WHERE clipAId = ? OR clipBId = ?)`,
      [clip.id, clip.id],
    );
    await manager.query(`DELETE FROM clip WHERE id = ?`, [clip.id]);
    await this.scrubAudit(manager, clip.id);
  }

  /** Earlier entries about a record, or naming it in their details, keep only who acted and when. */
  private async scrubAudit(manager: EntityManager, id: string): Promise<void> {
    await manager.query(
      `UPDATE audit_event SET targetId = NULL, details = NULL WHERE targetId = ? OR instr(details, ?) > 0`,
      [id, id],
    );
  }

  /** Objects after the rows: leftovers of a failure here are swept by the storage janitor by folder. */
  private async removeObjects(keys: Set<string>, clips: Clip[]): Promise<void> {
    for (const key of keys) await this.storage.delete(key);
    for (const clip of clips) this.caches.forgetClip(clip.id);
  }

  private record(manager: EntityManager, principal: Principal, action: string, targetType: string) {
    return this.audit.record(manager, {
      clubId: principal.clubId,
      actorUserId: principal.user.id,
      action,
      targetType,
    });
  }
}
