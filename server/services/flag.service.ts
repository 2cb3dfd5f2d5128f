import type { FlagDto, FlagListResponse, FlagQuery, FlagUpdateInput } from '@shared/schemas/flag.schema';
import type { Flag } from '../entities/flag.entity';
import { forbidden, notFound } from '../errors';
import { toClipFlagDto } from '../mappers/frame.mapper';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { AccessService } from './access.service';
import type { Clock, Principal } from './principal';
import type { TokenService } from './token.service';

/** The club's flags as coaching points: listed within the caller's reach, reviewed by their coaches. */
export class FlagService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly tokens: TokenService,
    private readonly clock: Clock,
  ) {}

  async list(principal: Principal, query: FlagQuery): Promise<FlagListResponse> {
    const athleteIds = await this.access.visibleAthleteIds(principal);
    // Athletes and guardians see flags of the clips reviews have shared with them.
    const reach = await this.access.clipReach(principal);
    const { rows, total } = await this.uow.repos.flags.search(
      { clubId: principal.clubId, athleteIds, ...reach.sql },
      query,
    );
    return { flags: await this.toDtos(principal, rows), total, page: query.page, pageSize: query.pageSize };
  }

  /** Marks a flag reviewed or dismissed (or unreviewed again), with the coach's comment. */
  async update(principal: Principal, flagId: string, input: FlagUpdateInput): Promise<FlagDto> {
    const flag = await this.uow.repos.flags.findById(flagId);
    const clip = flag ? await this.uow.repos.clips.findById(flag.clipId) : null;
    if (!flag || !clip || clip.clubId !== principal.clubId) throw notFound('Flag');
    const athlete = flag.athleteId ? await this.uow.repos.athletes.findById(flag.athleteId) : null;
    if (athlete && !this.access.canSeeAthlete(principal, athlete)) throw notFound('Flag');
    const mayReview = athlete
      ? this.access.canManageAthlete(principal, athlete)
      : principal.role === 'head_coach';
    if (!mayReview) throw forbidden('Only the head coach and the athlete’s coaches can review this flag');
    const now = this.clock.now();
    const patch = {
      status: input.status,
      statusComment: input.comment ? input.comment : null,
      statusById: principal.user.id,
      statusAt: now,
    };
    await this.uow.repos.flags.setStatus(flag.id, patch);
    const [dto] = await this.toDtos(principal, [{ ...flag, ...patch }]);
    return dto;
  }

  private async toDtos(principal: Principal, rows: Flag[]): Promise<FlagDto[]> {
    const repos = this.uow.repos;
    const clips = new Map((await repos.clips.findByIds(rows.map((r) => r.clipId))).map((c) => [c.id, c]));
    const sessions = new Map(
      (await repos.sessions.findByIds([...clips.values()].map((c) => c.sessionId))).map((s) => [s.id, s]),
    );
    const athleteIds = rows.flatMap((r) => (r.athleteId ? [r.athleteId] : []));
    const athletes = new Map(
      (await repos.athletes.findByIds([...new Set(athleteIds)])).map((a) => [a.id, a]),
    );
    const groups = new Map((await repos.club.listAgeGroups(principal.clubId)).map((g) => [g.id, g]));
    const names = await repos.users.namesByIds(rows.flatMap((r) => (r.statusById ? [r.statusById] : [])));
    const staff =
      principal.role === 'head_coach' || principal.role === 'coach' || principal.role === 'analyst';
    const links = new Map<string, string>();
    const thumbnailsOf = (clipId: string) => {
      if (!links.has(clipId)) links.set(clipId, this.tokens.clipLinks(principal, clipId).thumbnails);
      return links.get(clipId)!;
    };
    return rows.map((row) => {
      const clip = clips.get(row.clipId);
      const athlete = row.athleteId ? athletes.get(row.athleteId) : undefined;
      const group = row.ageGroupId ? groups.get(row.ageGroupId) : undefined;
      const timeMs = clip?.fps ? (row.frameIndex * 1000) / clip.fps : null;
      return {
        ...toClipFlagDto(row),
        clipId: row.clipId,
        clipName: clip?.originalName ?? '',
        sessionDate: clip ? (sessions.get(clip.sessionId)?.date ?? null) : null,
        athlete: athlete ? { id: athlete.id, name: `${athlete.firstName} ${athlete.lastName}` } : null,
        ageGroup: group ? { id: group.id, name: group.name } : null,
        timeMs,
        // Review comments are written for the other coaches; athletes and guardians see the state only.
        comment: staff ? row.statusComment : null,
        statusBy: staff && row.statusById ? (names.get(row.statusById) ?? null) : null,
        statusAt: row.statusAt?.toISOString() ?? null,
        createdAt: row.createdAt.toISOString(),
        thumbnails:
          clip?.thumbnailsKey && clip.thumbnails ? { url: thumbnailsOf(clip.id), ...clip.thumbnails } : null,
      };
    });
  }
}
