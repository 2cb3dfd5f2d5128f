import { randomUUID } from 'node:crypto';
import {
  clipPhaseValue,
  describeTarget,
  fixedPhaseOf,
  focusLabel,
  FOCUS_PHASE_LABELS,
  type FocusPhase,
} from '@shared/plan';
import {
  DEFAULT_REVIEW_OVERLAYS,
  type PublishReviewResponse,
  type ReviewDto,
  type ReviewFocusPointDto,
  type ReviewReceiptDto,
  type ReviewRecipientDto,
  type ReviewSummaryDto,
  type ReviewViewResponse,
  type UpdateReviewInput,
} from '@shared/schemas/review.schema';
import { BAND_METRICS, formatUnitValue, type BandMetricKey } from '@shared/tolerance';
import type { Athlete } from '../entities/athlete.entity';
import type { Review } from '../entities/review.entity';
import { conflict, fieldError, forbidden, HttpError, notFound } from '../errors';
import { reviewMail } from '../mail/templates';
import { guardianStillReaches, mayEmailReviewsOf } from './consent.rules';
import type { Mailer } from '../mail/mailer';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import type { ClipService } from './clip.service';
import type { FrameStore } from './frame-store';
import { toNoteDto } from './note.service';
import type { PasswordService } from './password.service';
import { toFocusPointDto } from './season-plan.service';
import type { Clock, Principal } from './principal';

const STAFF = new Set(['head_coach', 'coach', 'analyst']);
const isReader = (p: Principal) => p.role === 'athlete' || p.role === 'guardian';

interface Deps {
  uow: UnitOfWork;
  access: AccessService;
  clips: ClipService;
  frames: Pick<FrameStore, 'seriesSettled'>;
  passwords: Pick<PasswordService, 'setupLink'>;
  mailer: Mailer;
  audit: AuditService;
  clock: Clock;
  publicUrl: () => string;
}

/**
 * A coach's review of a clip for its athlete: a draft saved as it is written, published to the athlete
 * and their guardians by e-mail, withdrawn by unpublishing. Athletes and guardians read published
 * reviews only; each opening is a read receipt for the coach.
 */
export class ReviewService {
  constructor(private readonly deps: Deps) {}

  async create(principal: Principal, clipId: string, athleteId: string): Promise<ReviewDto> {
    const { uow, clips, clock } = this.deps;
    if (principal.role !== 'head_coach' && principal.role !== 'coach')
      throw forbidden('Only coaches and the head coach write reviews');
    const clip = await clips.findVisible(principal, clipId);
    const athlete = await this.managedAthlete(principal, athleteId);
    const tagged = (await uow.repos.clips.athleteIdsByClip([clip.id])).get(clip.id) ?? [];
    if (!tagged.includes(athlete.id))
      throw fieldError(
        'athleteId',
        `${athlete.firstName} is not tagged in this clip; tag them first or choose the clip's athlete`,
      );
    const now = clock.now();
    const review: Review = {
      id: randomUUID(),
      clubId: principal.clubId,
      clipId: clip.id,
      athleteId: athlete.id,
      createdById: principal.user.id,
      title: `${athlete.firstName}: ${clip.originalName.replace(/\.[^.]+$/, '')}`,
      summary: '',
      status: 'draft',
      overlays: { ...DEFAULT_REVIEW_OVERLAYS },
      compareClipId: null,
      showCurves: false,
      publishedAt: null,
      withdrawnAt: null,
      publishCount: 0,
      createdAt: now,
      updatedAt: now,
    };
    await uow.transaction(async (manager) => {
      await uow.of(manager).reviews.insert(review);
      await this.record(manager, principal, 'review.create', review.id);
    });
    return (await this.toDtos(principal, [review]))[0];
  }

  /** Saves part of a draft (or of a withdrawn review being corrected); a published one is unpublished first. */
  async update(principal: Principal, id: string, input: UpdateReviewInput): Promise<ReviewDto> {
    const { uow, clock } = this.deps;
    const review = await this.writable(principal, id);
    if (review.status === 'published')
      throw conflict(
        'review_published',
        'This review is published; unpublish it to correct it, then publish again',
      );
    if (input.noteIds) {
      const notes = new Set((await uow.repos.notes.listByClip(review.clipId)).map((n) => n.id));
      const foreign = input.noteIds.find((n) => !notes.has(n));
      if (foreign)
        throw fieldError('noteIds', 'A chosen note belongs to another clip; choose notes of this clip');
    }
    if (input.focusPointIds) {
      for (const pid of input.focusPointIds) {
        const point = await uow.repos.plans.findFocusPoint(pid);
        if (!point || point.athleteId !== review.athleteId)
          throw fieldError('focusPointIds', 'A chosen focus point is not in this athlete’s season plan');
      }
    }
    if (input.stillIds) {
      for (const sid of input.stillIds) {
        const still = await uow.repos.plans.findStill(sid);
        if (!still || (still.clipAId !== review.clipId && still.clipBId !== review.clipId))
          throw fieldError(
            'stillIds',
            'A chosen still does not show this clip; keep one from Compare with this clip',
          );
      }
    }
    if (input.compareClipId) {
      const other = await this.deps.clips.findVisible(principal, input.compareClipId).catch(() => null);
      const tagged = other ? ((await uow.repos.clips.athleteIdsByClip([other.id])).get(other.id) ?? []) : [];
      if (!other || other.id === review.clipId || !tagged.includes(review.athleteId))
        throw fieldError('compareClipId', 'Compare with another clip of the same athlete (the baseline)');
    }
    const patch: Partial<Review> = { updatedAt: clock.now() };
    if (input.title !== undefined) patch.title = input.title;
    if (input.summary !== undefined) patch.summary = input.summary;
    if (input.overlays !== undefined) patch.overlays = input.overlays;
    if (input.compareClipId !== undefined) patch.compareClipId = input.compareClipId;
    if (input.showCurves !== undefined) patch.showCurves = input.showCurves;
    await uow.transaction(async (manager) => {
      const repos = uow.of(manager);
      await repos.reviews.update(review.id, patch);
      if (input.noteIds) await repos.reviews.setItems(review.id, 'note', input.noteIds, randomUUID);
      if (input.focusPointIds)
        await repos.reviews.setItems(review.id, 'focus_point', input.focusPointIds, randomUUID);
      if (input.stillIds) await repos.reviews.setItems(review.id, 'still', input.stillIds, randomUUID);
    });
    return (await this.toDtos(principal, [{ ...review, ...patch }]))[0];
  }

  async get(principal: Principal, id: string): Promise<ReviewDto> {
    return (await this.toDtos(principal, [await this.readable(principal, id)]))[0];
  }

  async list(
    principal: Principal,
    filter: { clipId?: string; athleteId?: string },
  ): Promise<ReviewSummaryDto[]> {
    const visible = await this.deps.access.visibleAthleteIds(principal);
    let athleteIds = visible ?? undefined;
    if (filter.athleteId)
      athleteIds = (athleteIds ?? [filter.athleteId]).filter((a) => a === filter.athleteId);
    const rows = await this.deps.uow.repos.reviews.list({
      clubId: principal.clubId,
      clipId: filter.clipId,
      athleteIds,
      // Drafts and withdrawn reviews are the staff's; athletes and guardians read published ones.
      publishedOnly: isReader(principal),
    });
    // Reviews of an athlete whose consent is withdrawn go out of sight with their clips.
    const reach = await this.deps.access.clipReach(principal);
    return (
      await this.toDtos(
        principal,
        rows.filter((r) => reach.allows(r.clipId)),
      )
    ).map(({ id, clipId, clipName, athlete, title, status, publishedAt, updatedAt, author, unread }) => ({
      id,
      clipId,
      clipName,
      athlete,
      title,
      status,
      publishedAt,
      updatedAt,
      author,
      unread,
    }));
  }

  /** The review page: what the athlete sees. Opening a published review as its reader is a read receipt. */
  async view(principal: Principal, id: string): Promise<ReviewViewResponse> {
    const { uow, clips, clock } = this.deps;
    const review = await this.readable(principal, id);
    if (isReader(principal)) {
      await uow.repos.reviews.recordOpen(review.id, principal.user.id, clock.now(), randomUUID);
    }
    const [dto] = await this.toDtos(principal, [review]);
    const clip = (await clips.get(principal, review.clipId)).clip;
    const compareClip = review.compareClipId
      ? ((await clips.get(principal, review.compareClipId).catch(() => null))?.clip ?? null)
      : null;
    const notesById = new Map((await uow.repos.notes.listByClip(review.clipId)).map((n) => [n.id, n]));
    const authors = await uow.repos.users.namesByIds(
      [...notesById.values()].flatMap((n) => (n.authorId ? [n.authorId] : [])),
    );
    const notes = dto.noteIds
      .map((nid) => notesById.get(nid))
      .filter((n) => n !== undefined)
      .map((n) => toNoteDto(n, authors.get(n.authorId ?? '') ?? null))
      .sort((a, b) => a.timeMs - b.timeMs);
    const stillRows = await Promise.all(dto.stillIds.map((sid) => uow.repos.plans.findStill(sid)));
    const stillDtos = stillRows
      .filter((s) => s !== null)
      .map((s) => ({
        id: s.id,
        clipAId: s.clipAId,
        clipBId: s.clipBId,
        frameA: s.frameA,
        frameB: s.frameB,
        caption: s.caption,
        createdAt: s.createdAt.toISOString(),
        createdBy: null,
      }));
    return {
      review: dto,
      clip,
      compareClip,
      notes,
      focusPoints: await this.focusPoints(review, dto.focusPointIds, clip.view),
      stills: stillDtos,
      preview: !isReader(principal),
    };
  }

  async publish(principal: Principal, id: string): Promise<PublishReviewResponse> {
    const { uow, clock, mailer, passwords } = this.deps;
    const review = await this.writable(principal, id);
    if (review.status === 'published') throw conflict('review_published', 'This review is published already');
    if (review.summary.trim() === '')
      throw fieldError('summary', 'Write a short summary first: it is what the e-mail says');
    const athlete = (await uow.repos.athletes.findById(review.athleteId))!;
    const now = clock.now();
    if (athlete.consentWithdrawnAt)
      throw conflict(
        'consent_withdrawn',
        `Consent for ${athlete.firstName} is withdrawn: reviews cannot be shared unless it is restored`,
      );
    // Without consent to e-mail, the review waits on the Home page of those who have an account.
    const byEmail = mayEmailReviewsOf(athlete, now);
    const recipients = (await this.recipients(athlete, now)).filter((r) => byEmail || r.user.passwordHash);
    if (recipients.length === 0)
      throw conflict(
        'no_recipients',
        byEmail
          ? `${athlete.firstName} has no account and no guardian with an e-mail address; invite one from the athlete page first`
          : `Consent for ${athlete.firstName} does not cover e-mail and nobody of theirs has an account yet; record consent to send reviews by e-mail, or invite them first`,
      );
    const patch: Partial<Review> = {
      status: 'published',
      publishedAt: now,
      withdrawnAt: null,
      publishCount: review.publishCount + 1,
      updatedAt: now,
    };
    await uow.transaction(async (manager) => {
      await uow.of(manager).reviews.update(review.id, patch);
      await this.record(manager, principal, 'review.publish', review.id, { recipients: recipients.length });
    });
    const club = await uow.repos.club.findById(principal.clubId);
    const path = `/reviews/${review.id}`;
    const sent: ReviewRecipientDto[] = [];
    for (const r of recipients) {
      if (!byEmail) {
        sent.push({ name: r.user.name, email: r.user.email, role: r.role, invited: false, emailed: false });
        continue;
      }
      const invited = !r.user.passwordHash;
      const link = invited ? await passwords.setupLink(r.user.id, path) : `${this.deps.publicUrl()}${path}`;
      await mailer.send(
        reviewMail({
          to: r.user.email,
          recipientName: r.user.name,
          athleteName: `${athlete.firstName} ${athlete.lastName}`,
          coachName: principal.user.name,
          clubName: club?.name ?? 'your club',
          title: review.title,
          summary: review.summary,
          link,
          setsPassword: invited,
          republished: review.publishCount > 0,
        }),
      );
      sent.push({ name: r.user.name, email: r.user.email, role: r.role, invited, emailed: true });
    }
    return { review: (await this.toDtos(principal, [{ ...review, ...patch }]))[0], recipients: sent };
  }

  async unpublish(principal: Principal, id: string): Promise<ReviewDto> {
    const { uow, clock } = this.deps;
    const review = await this.writable(principal, id);
    if (review.status !== 'published') throw conflict('review_not_published', 'This review is not published');
    const now = clock.now();
    const patch: Partial<Review> = { status: 'withdrawn', withdrawnAt: now, updatedAt: now };
    await uow.transaction(async (manager) => {
      await uow.of(manager).reviews.update(review.id, patch);
      await this.record(manager, principal, 'review.unpublish', review.id);
    });
    return (await this.toDtos(principal, [{ ...review, ...patch }]))[0];
  }

  async receipts(principal: Principal, id: string): Promise<ReviewReceiptDto[]> {
    const review = await this.readable(principal, id);
    if (!STAFF.has(principal.role)) throw forbidden('Read receipts are for the coaches');
    const rows = await this.deps.uow.repos.reviews.receipts([review.id]);
    const users = await Promise.all(rows.map((r) => this.deps.uow.repos.users.findById(r.userId)));
    return rows.flatMap((r, i) => {
      const user = users[i];
      if (!user || (user.role !== 'athlete' && user.role !== 'guardian')) return [];
      return [
        {
          name: user.name,
          role: user.role,
          firstOpenedAt: r.firstOpenedAt.toISOString(),
          lastOpenedAt: r.lastOpenedAt.toISOString(),
          opens: r.opens,
        },
      ];
    });
  }

  /** The athlete's own account and each guardian's who still has access, with an e-mail address. */
  private async recipients(athlete: Athlete, now: Date) {
    const repos = this.deps.uow.repos;
    const out: {
      user: NonNullable<Awaited<ReturnType<typeof repos.users.findById>>>;
      role: 'athlete' | 'guardian';
    }[] = [];
    if (athlete.userId) {
      const user = await repos.users.findById(athlete.userId);
      if (user?.email) out.push({ user, role: 'athlete' });
    }
    const links = new Map((await repos.athletes.guardianLinks(athlete.id)).map((l) => [l.guardianUserId, l]));
    for (const guardian of await repos.athletes.guardiansOf(athlete.id)) {
      const kept = links.get(guardian.id)?.keptByAthleteAt ?? null;
      if (guardian.email && guardianStillReaches(athlete.birthYear, kept, now))
        out.push({ user: guardian, role: 'guardian' });
    }
    return out;
  }

  private async focusPoints(
    review: Review,
    ids: string[],
    view: 'front' | 'side',
  ): Promise<ReviewFocusPointDto[]> {
    const { uow, frames } = this.deps;
    const points = (await Promise.all(ids.map((pid) => uow.repos.plans.findFocusPoint(pid)))).filter(
      (p) => p !== null,
    );
    const clip = await uow.repos.clips.findById(review.clipId);
    const stored = clip ? await uow.repos.frames.framesPerClipModel([clip.id]) : [];
    const model = stored.find((s) => s.model === clip?.defaultModel)?.model ?? stored[0]?.model ?? null;
    let metricFrames: Awaited<ReturnType<typeof uow.repos.frames.listMetrics>> = [];
    let turns: NonNullable<Awaited<ReturnType<typeof uow.repos.clipTurns.find>>>['turns'] = [];
    if (clip && model) {
      await frames.seriesSettled(clip.id, model);
      metricFrames = await uow.repos.frames.listMetrics(clip.id, model);
      turns = (await uow.repos.clipTurns.find(clip.id, model))?.turns ?? [];
    }
    return points.map((p) => {
      const dto = toFocusPointDto(p);
      if (!p.metric || !p.phase) return { point: dto, value: null, words: p.title };
      const info = BAND_METRICS[p.metric as BandMetricKey];
      const value = model
        ? clipPhaseValue(
            { view, frames: metricFrames, turns },
            p.metric as BandMetricKey,
            p.phase as FocusPhase,
          )
        : null;
      const target = describeTarget({ min: p.targetMin, max: p.targetMax, direction: p.direction }, info);
      const measured =
        value?.median !== null && value?.median !== undefined
          ? `${info.label} ${formatUnitValue(value.median, info.unit)}${fixedPhaseOf(p.metric as BandMetricKey) ? '' : ` ${FOCUS_PHASE_LABELS[p.phase as FocusPhase]}`}`
          : `${focusLabel(p.metric as BandMetricKey, p.phase as FocusPhase)}: ${value?.reason ?? 'not analysed yet'}`;
      return { point: dto, value, words: `${measured}, target ${target}` };
    });
  }

  /** A review the caller may read: staff within their reach; athletes and guardians a published one of theirs. */
  private async readable(principal: Principal, id: string): Promise<Review> {
    const review = await this.deps.uow.repos.reviews.findById(id);
    if (!review || review.clubId !== principal.clubId) throw notFound('Review');
    const athlete = await this.deps.uow.repos.athletes.findById(review.athleteId);
    if (!athlete || !this.deps.access.canSeeAthlete(principal, athlete)) throw notFound('Review');
    if (athlete.consentWithdrawnAt && principal.role !== 'head_coach') throw notFound('Review');
    if (isReader(principal)) {
      if (review.status === 'withdrawn')
        throw new HttpError(
          410,
          'review_withdrawn',
          'Your coach has withdrawn this review; a corrected one may follow',
        );
      if (review.status !== 'published') throw notFound('Review');
    }
    return review;
  }

  private async writable(principal: Principal, id: string): Promise<Review> {
    const review = await this.readable(principal, id);
    await this.managedAthlete(principal, review.athleteId);
    return review;
  }

  private async managedAthlete(principal: Principal, athleteId: string): Promise<Athlete> {
    const athlete = await this.deps.uow.repos.athletes.findById(athleteId);
    if (!athlete || !this.deps.access.canSeeAthlete(principal, athlete)) throw notFound('Athlete');
    if (!this.deps.access.canManageAthlete(principal, athlete))
      throw forbidden('Only the head coach and the athlete’s coaches write and publish reviews');
    return athlete;
  }

  private async toDtos(principal: Principal, rows: Review[]): Promise<ReviewDto[]> {
    const repos = this.deps.uow.repos;
    const clips = new Map((await repos.clips.findByIds(rows.map((r) => r.clipId))).map((c) => [c.id, c]));
    const athletes = new Map(
      (await repos.athletes.findByIds(rows.map((r) => r.athleteId))).map((a) => [a.id, a]),
    );
    const authors = await repos.users.namesByIds(rows.flatMap((r) => (r.createdById ? [r.createdById] : [])));
    const items = await repos.reviews.items(rows.map((r) => r.id));
    const mine = isReader(principal)
      ? new Map(
          (await repos.reviews.receipts(rows.map((r) => r.id)))
            .filter((r) => r.userId === principal.user.id)
            .map((r) => [r.reviewId, r]),
        )
      : new Map();
    return rows.map((r) => {
      const athlete = athletes.get(r.athleteId);
      const of = (kind: string) =>
        items.filter((i) => i.reviewId === r.id && i.kind === kind).map((i) => i.refId);
      const receipt = mine.get(r.id);
      return {
        id: r.id,
        clipId: r.clipId,
        clipName: clips.get(r.clipId)?.originalName ?? '',
        athlete: { id: r.athleteId, name: athlete ? `${athlete.firstName} ${athlete.lastName}` : '' },
        title: r.title,
        status: r.status,
        publishedAt: r.publishedAt?.toISOString() ?? null,
        updatedAt: r.updatedAt.toISOString(),
        author: r.createdById ? (authors.get(r.createdById) ?? null) : null,
        unread:
          isReader(principal) &&
          r.status === 'published' &&
          (!receipt || (r.publishedAt !== null && receipt.lastOpenedAt < r.publishedAt)),
        summary: r.summary,
        overlays: r.overlays,
        noteIds: of('note'),
        focusPointIds: of('focus_point'),
        stillIds: of('still'),
        compareClipId: r.compareClipId,
        showCurves: r.showCurves,
        withdrawnAt: r.withdrawnAt?.toISOString() ?? null,
        createdAt: r.createdAt.toISOString(),
      };
    });
  }

  private record(
    manager: Parameters<AuditService['record']>[0],
    principal: Principal,
    action: string,
    targetId: string,
    details?: Record<string, unknown>,
  ) {
    return this.deps.audit.record(manager, {
      clubId: principal.clubId,
      actorUserId: principal.user.id,
      action,
      targetType: 'review',
      targetId,
      details,
    });
  }
}
