import { once } from 'node:events';
import { PassThrough, type Readable, type Writable } from 'node:stream';
import archiver from 'archiver';
import type { ExportKind } from '@shared/exports/codebook';
import type { AthleteExportLinkResponse } from '@shared/schemas/consent.schema';
import type { Athlete } from '../entities/athlete.entity';
import type { Clip } from '../entities/clip.entity';
import type { TrainingSession } from '../entities/training-session.entity';
import { forbidden, notFound } from '../errors';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { ObjectStorage } from '../storage/object-storage';
import type { AccessService } from './access.service';
import { consentStatus } from './consent.rules';
import { toConsentEventDto } from './consent.service';
import type { ExportService } from './export.service';
import { notesToWebVtt } from './notes-vtt';
import type { Clock, Principal } from './principal';
import type { TokenService } from './token.service';

/** The version of athlete.json's layout; a reader checks it before anything else. */
export const ATHLETE_EXPORT_FORMAT = { name: 'stanceline-athlete-export', version: 1 } as const;

const CSV_KINDS: ExportKind[] = ['frames', 'turns', 'keypoints'];

/** What a download will hold, found before the response starts (so refusals are plain 4xx). */
export interface AthleteExportPlan {
  athlete: Athlete;
  clips: Clip[];
  fileName: string;
}

/** A file name part from free text: letters, digits and dashes. */
function slug(text: string): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[^\w\s-]/g, '')
      .trim()
      .replace(/[\s_]+/g, '-')
      .toLowerCase()
      .slice(0, 40) || 'clip'
  );
}

/** The folder of one clip's files inside the zip: its session day, its name and a short id. */
export function clipFolder(clip: Pick<Clip, 'id' | 'originalName'>, sessionDate: string): string {
  return `${sessionDate}-${slug(clip.originalName.replace(/\.[^.]+$/, ''))}-${clip.id.slice(0, 8)}`;
}

/**
 * All of one athlete's data as a zip, streamed: athlete.json (the records), the CSV exports of their
 * clips, each clip's notes as WebVTT, and the media files. Asked for by the athlete, a guardian who
 * still has access, or the head coach honouring a request. Every clip the athlete is tagged in is
 * included, shared in a review or not, withdrawn or not: it is their data.
 */
export class DataExportService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly exports: ExportService,
    private readonly storage: ObjectStorage,
    private readonly tokens: TokenService,
    private readonly clock: Clock,
  ) {}

  async plan(principal: Principal, athleteId: string): Promise<AthleteExportPlan> {
    const athlete = await this.uow.repos.athletes.findById(athleteId);
    if (!athlete || !this.access.canSeeAthlete(principal, athlete)) throw notFound('Athlete');
    const own =
      principal.role === 'head_coach' ||
      (principal.role === 'athlete' && principal.athleteId === athlete.id) ||
      (principal.role === 'guardian' && principal.childAthleteIds.includes(athlete.id));
    if (!own)
      throw forbidden('The athlete, their guardians and the head coach download all of an athlete’s data');
    const clips = await this.uow.repos.clips.findByIds(await this.uow.repos.athletes.clipIdsOf(athlete.id));
    const day = this.clock.now().toISOString().slice(0, 10);
    return {
      athlete,
      clips,
      fileName: `stanceline-${slug(`${athlete.firstName} ${athlete.lastName}`)}-${day}.zip`,
    };
  }

  /** A signed address the browser downloads from (streamed to disk, not held in the page), with its size. */
  async link(principal: Principal, athleteId: string): Promise<AthleteExportLinkResponse> {
    const plan = await this.plan(principal, athleteId);
    const bytes = plan.clips.reduce((sum, c) => sum + c.sizeBytes + (c.proxySizeBytes ?? 0), 0);
    return {
      url: this.tokens.athleteExportLink(principal, plan.athlete.id),
      fileName: plan.fileName,
      clips: plan.clips.length,
      approxBytes: bytes,
    };
  }

  /** Streams the zip to `out`; stops when `stopped()` turns true (the client went away). */
  async write(plan: AthleteExportPlan, out: Writable, stopped: () => boolean): Promise<void> {
    const archive = archiver('zip', { zlib: { level: 6 } });
    const failed = new Promise<never>((_, reject) => archive.once('error', reject));
    failed.catch(() => undefined);
    archive.pipe(out);
    // One entry at a time: each is appended, filled (a CSV written into its stream), and finished.
    const add = async (source: string | Readable, name: string, fill?: () => Promise<void>) => {
      const entered = once(archive, 'entry');
      archive.append(source, { name, date: this.clock.now() });
      if (fill) await Promise.race([fill(), failed]);
      await Promise.race([entered, failed]);
    };

    const { athlete, clips } = plan;
    const sessions = new Map(
      (await this.uow.repos.sessions.findByIds(clips.map((c) => c.sessionId))).map((s) => [s.id, s]),
    );
    const dateOf = (clip: Clip) =>
      sessions.get(clip.sessionId)?.date ?? clip.createdAt.toISOString().slice(0, 10);
    const folders = new Map(clips.map((c) => [c.id, clipFolder(c, dateOf(c))]));

    await add(JSON.stringify(await this.records(plan, folders, sessions, dateOf), null, 2), 'athlete.json');
    await add(readme(athlete), 'README.txt');

    // The same CSVs as the exports page, for this athlete's analysed clips.
    const exportClips = await this.uow.repos.exports.clips({
      clubId: athlete.clubId,
      visibleAthleteIds: null,
      athleteId: athlete.id,
    });
    const firstAthletes = new Map(exportClips.map((c) => [c.id, athlete.id]));
    for (const kind of CSV_KINDS) {
      if (stopped()) break;
      const csv = new PassThrough();
      await add(csv, `${kind}.csv`, () =>
        this.exports.write(
          { clips: exportClips, firstAthletes },
          kind,
          { values: 'raw', metrics: undefined },
          csv,
          stopped,
        ),
      );
    }

    for (const clip of clips) {
      if (stopped()) break;
      const folder = folders.get(clip.id)!;
      const notes = await this.uow.repos.notes.listByClip(clip.id);
      if (notes.length > 0) {
        const names = await this.uow.repos.users.namesByIds(
          notes.map((n) => n.authorId).filter((id): id is string => id !== null),
        );
        const vtt = notesToWebVtt(
          notes.map((n) => ({
            id: n.id,
            timeMs: n.timeMs,
            text: n.body,
            author: names.get(n.authorId ?? '') ?? null,
          })),
          clip.durationMs,
        );
        await add(vtt, `clips/${folder}/notes.vtt`);
      }
      for (const [key, name] of mediaFiles(clip)) {
        if (stopped()) break;
        await add(await this.storage.getStream(key), `clips/${folder}/${name}`);
      }
    }
    if (stopped()) {
      archive.abort();
      return;
    }
    const closed = once(out, 'close').catch(() => undefined);
    await Promise.race([archive.finalize(), failed]);
    await Promise.race([closed, failed]);
  }

  private async records(
    { athlete, clips }: AthleteExportPlan,
    folders: Map<string, string>,
    sessions: Map<string, TrainingSession>,
    dateOf: (clip: Clip) => string,
  ) {
    const repos = this.uow.repos;
    const now = this.clock.now();
    const group = await repos.club.findAgeGroup(athlete.ageGroupId);
    const guardians = await repos.athletes.guardiansOf(athlete.id);
    const events = await repos.athletes.consentEvents(athlete.id);
    const reviews = await repos.reviews.list({ clubId: athlete.clubId, athleteIds: [athlete.id] });
    const seasons = await repos.plans.listSeasons(athlete.clubId);
    const userIds = [...events.map((e) => e.recordedById), ...reviews.map((r) => r.createdById)].filter(
      (id): id is string => id !== null,
    );
    const names = await repos.users.namesByIds(userIds);
    const clipRecords = [];
    for (const clip of clips) {
      const notes = await repos.notes.listByClip(clip.id);
      const noteAuthors = await repos.users.namesByIds(
        notes.map((n) => n.authorId).filter((id): id is string => id !== null),
      );
      const flags = await repos.flags.list(clip.id, clip.defaultModel);
      const session = sessions.get(clip.sessionId);
      const folder = folders.get(clip.id)!;
      clipRecords.push({
        id: clip.id,
        originalName: clip.originalName,
        view: clip.view,
        status: clip.status,
        uploadedAt: clip.createdAt.toISOString(),
        session: session
          ? { date: session.date, venue: session.venue, discipline: session.discipline, snow: session.snow }
          : { date: dateOf(clip) },
        video: {
          width: clip.width,
          height: clip.height,
          fps: clip.fps,
          frameCount: clip.frameCount,
          durationMs: clip.durationMs,
          sizeBytes: clip.sizeBytes,
          sha256: clip.sha256,
        },
        files: Object.fromEntries(mediaFiles(clip).map(([, name]) => [name, `clips/${folder}/${name}`])),
        notesFile: notes.length > 0 ? `clips/${folder}/notes.vtt` : null,
        notes: notes.map((n) => ({
          id: n.id,
          timeMs: n.timeMs,
          frameIndex: n.frameIndex,
          text: n.body,
          author: noteAuthors.get(n.authorId ?? '') ?? null,
          createdAt: n.createdAt.toISOString(),
        })),
        // Coaches' comments on a flag are their working notes; the app shows athletes the state only.
        flags: flags.map((f) => ({
          metric: f.metric,
          turnIndex: f.turnIndex,
          firstFrame: f.firstFrame,
          lastFrame: f.lastFrame,
          frameCount: f.frameCount,
          worstFrame: f.frameIndex,
          value: f.value,
          bandMin: f.bandMin,
          bandMax: f.bandMax,
          status: f.status,
        })),
      });
    }
    const plan = [];
    for (const season of seasons) {
      const points = await repos.plans.listFocusPoints(athlete.id, season.id);
      if (points.length === 0) continue;
      plan.push({
        season: { name: season.name, startsOn: season.startsOn, endsOn: season.endsOn },
        focusPoints: points.map((p) => ({
          title: p.title,
          cue: p.cue,
          metric: p.metric,
          phase: p.phase,
          targetMin: p.targetMin,
          targetMax: p.targetMax,
          direction: p.direction,
          status: p.status,
        })),
      });
    }
    return {
      format: ATHLETE_EXPORT_FORMAT.name,
      version: ATHLETE_EXPORT_FORMAT.version,
      exportedAt: now.toISOString(),
      athlete: {
        id: athlete.id,
        firstName: athlete.firstName,
        lastName: athlete.lastName,
        birthYear: athlete.birthYear,
        ageGroup: group?.name ?? null,
        createdAt: athlete.createdAt.toISOString(),
      },
      consent: {
        status: consentStatus(athlete, now),
        shareByEmail: athlete.consentShareByEmail,
        withdrawnAt: athlete.consentWithdrawnAt?.toISOString() ?? null,
        erasureDueAt: athlete.erasureDueAt?.toISOString() ?? null,
        record: events.map((e) => toConsentEventDto(e, names)),
      },
      guardians: guardians.map((g) => ({ name: g.name, email: g.email })),
      clips: clipRecords,
      reviews: reviews.map((r) => ({
        id: r.id,
        clipId: r.clipId,
        title: r.title,
        summary: r.summary,
        status: r.status,
        publishedAt: r.publishedAt?.toISOString() ?? null,
        author: r.createdById ? (names.get(r.createdById) ?? null) : null,
      })),
      seasonPlans: plan,
    };
  }
}

/** The stored files of a clip and their names in the zip: the upload as it came, its playable copy, its poster. */
function mediaFiles(clip: Clip): [key: string, name: string][] {
  const ext = /\.[a-z0-9]{1,5}$/i.exec(clip.originalName)?.[0].toLowerCase() ?? '';
  const files: [string, string][] = [[clip.storageKey, `original${ext}`]];
  if (clip.proxyKey) files.push([clip.proxyKey, 'playable.mp4']);
  if (clip.posterKey) files.push([clip.posterKey, 'poster.jpg']);
  return files;
}

function readme(athlete: Athlete): string {
  return [
    `All data Stanceline holds about ${athlete.firstName} ${athlete.lastName}, as of the download.`,
    '',
    'athlete.json   the records: athlete, consent record, guardians, clips with notes and flags, reviews, season plans',
    'frames.csv     per-frame angles of each analysed clip (units in the header)',
    'turns.csv      per-turn values of each analysed clip',
    'keypoints.csv  the body points each angle was measured from',
    'clips/<day-name-id>/  original video, playable copy, poster, and notes.vtt (notes as captions)',
    '',
    'The angles are 2D estimates from one camera: a coaching aid, not a medical or injury assessment.',
    'The CSV columns are explained on the Exports page of Stanceline (the codebook).',
    '',
  ].join('\r\n');
}
