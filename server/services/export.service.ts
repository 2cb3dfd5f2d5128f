import { once } from 'node:events';
import type { Writable } from 'node:stream';
import { stringify } from 'csv-stringify/sync';
import {
  codebook,
  exportColumns,
  formatExportNumber,
  neutraliseFormula,
  type ExportKind,
} from '@shared/exports/codebook';
import type { Keypoint } from '@shared/keypoints';
import { METRIC_DEFINITIONS, METRIC_KEYS, type MetricKey } from '@shared/metrics';
import type { CodebookResponse, ExportCountResponse, ExportQuery } from '@shared/schemas/export.schema';
import { DEFAULT_MAX_GAP_FRAMES } from '@shared/series';
import { notFound } from '../errors';
import type { ExportClip } from '../repositories/export.repository';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { AccessService } from './access.service';
import type { FrameStore } from './frame-store';
import type { Principal } from './principal';

/** Stored frames read per page: a few milliseconds of work between turns of the event loop. */
const PAGE = 200;

/** Rough bytes per cell for the size shown before a download (numbers of 4 to 8 characters). */
const BYTES_PER_CELL = 7;

/** The keypoints each metric reads, looked up once (the hot loop of a large export runs per row). */
const METRIC_POINTS = new Map(METRIC_KEYS.map((key) => [key, METRIC_DEFINITIONS[key].keypoints] as const));

/** Mean score of the keypoints a metric reads, among those found; null when none was found. */
function meanScore(scores: Record<string, number>, key: MetricKey): number | null {
  let sum = 0;
  let count = 0;
  for (const name of METRIC_POINTS.get(key)!) {
    const score = scores[name];
    if (score === undefined) continue;
    sum += score;
    count += 1;
  }
  return count === 0 ? null : sum / count;
}

type Cell = string | number | boolean | null;

/** Where rows go: written at once, with a wait for the client after each page. */
interface Sink {
  emit(row: Cell[]): void;
  flush(): Promise<void>;
}

/** What an export will cover, found before the response starts. */
export interface ExportPlan {
  clips: ExportClip[];
  firstAthletes: Map<string, string>;
}

/**
 * The CSV exports: the clips a caller may see, narrowed by the filters, streamed row by row from the
 * database through csv-stringify (RFC 4180, UTF-8) to the response, waiting whenever the client reads
 * slower than the rows come, and stopping when it goes away.
 */
export class ExportService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly frames: FrameStore,
  ) {}

  codebook(): CodebookResponse {
    return {
      columns: codebook(),
      smoothing: `values=smoothed: keypoint tracks gap-filled over at most ${DEFAULT_MAX_GAP_FRAMES} missing frames, then a zero-lag second-order Butterworth low-pass at 6 Hz (run forward and back, cut-off corrected by 0.802), then the metrics computed on the smoothed points. values=raw: each frame's own metrics, as the readouts show them.`,
      numbers:
        'Decimal point, no thousands separator, no exponent, at most six decimals. An empty cell is a value not measured (see "empty" of each column). true/false for yes/no columns. Files are UTF-8 with a byte-order mark, comma-separated, CRLF line ends, quoted where RFC 4180 asks.',
    };
  }

  async count(principal: Principal, query: ExportQuery & { kind: ExportKind }): Promise<ExportCountResponse> {
    const clips = await this.clips(principal, query);
    const sizes = await this.uow.repos.exports.sizes(clips);
    let rows = 0;
    for (const clip of clips) {
      const size = sizes.get(clip.id)!;
      rows +=
        query.kind === 'frames' ? size.frames : query.kind === 'keypoints' ? size.keypoints : size.turns;
    }
    const columns = exportColumns(query.kind, query.metrics);
    return {
      kind: query.kind,
      clips: clips.length,
      rows,
      approxBytes: (rows + 1) * columns.length * BYTES_PER_CELL,
      columns,
    };
  }

  /** The clips an export covers; throws (404, 400) before anything is written. */
  async plan(principal: Principal, query: ExportQuery): Promise<ExportPlan> {
    const clips = await this.clips(principal, query);
    return { clips, firstAthletes: await this.firstVisibleAthletes(principal, clips) };
  }

  /** Writes the chosen export to `out` as CSV; resolves when done or when `stopped()` turns true. */
  async write(
    { clips, firstAthletes }: ExportPlan,
    kind: ExportKind,
    query: ExportQuery,
    out: Writable,
    stopped: () => boolean,
  ): Promise<void> {
    const columns = exportColumns(kind, query.metrics);
    // Each page becomes one CSV string at once (csv-stringify's sync API): rows do not wait as objects
    // in a stream's buffer, where they would outlive the young generation and swell the heap.
    const options = {
      columns,
      record_delimiter: 'windows' as const,
      cast: { number: formatExportNumber, boolean: (v: boolean) => (v ? 'true' : 'false') },
    };
    let pending: Cell[][] = [];
    let first = true;
    const sink: Sink = {
      emit: (row) => void pending.push(row),
      flush: async () => {
        if (pending.length === 0 && !first) return;
        const text = stringify(pending, { ...options, header: first, bom: first });
        first = false;
        pending = [];
        // Backpressure: when the client reads slower than the rows come, wait for it to catch up.
        if (!out.write(text) && !out.destroyed) await drainedOrClosed(out);
        // The database driver is synchronous: without a turn of the event loop here a long export
        // would hold every other request back until it ends.
        await new Promise((resolve) => setImmediate(resolve));
      },
    };
    try {
      for (const clip of clips) {
        if (stopped()) return;
        const lead: Cell[] = [
          clip.id,
          neutraliseFormula(clip.originalName),
          firstAthletes.get(clip.id) ?? null,
          clip.sessionDate,
          clip.view,
          clip.model,
        ];
        if (kind === 'frames') await this.frameRows(clip, lead, query, sink, stopped);
        else if (kind === 'keypoints') await this.keypointRows(clip, lead, sink, stopped);
        else await this.turnRows(clip, lead, sink);
      }
      await sink.flush();
    } finally {
      if (!out.destroyed) out.end();
    }
  }

  private async frameRows(
    clip: ExportClip,
    lead: Cell[],
    query: ExportQuery,
    sink: Sink,
    stopped: () => boolean,
  ): Promise<void> {
    // In the codebook's (and the header's) order, whatever order they were asked in.
    const metrics = METRIC_KEYS.filter((key) => !query.metrics || query.metrics.includes(key));
    const row = (
      frameIndex: number,
      timeMs: number,
      corrected: boolean,
      careful: boolean,
      values: Partial<Record<MetricKey, number | null>>,
      keypoints: readonly Keypoint[],
    ): Cell[] => {
      const scores: Record<string, number> = {};
      for (const k of keypoints) scores[k.name] = k.score;
      const cells: Cell[] = [...lead, frameIndex, timeMs, corrected, careful];
      for (const key of metrics) cells.push(values[key] ?? null, meanScore(scores, key));
      return cells;
    };
    if (query.values === 'smoothed') {
      const series = await this.frames.smoothed(await this.clipRow(clip.id), clip.model);
      const corrected = new Set<number>();
      const careful = new Set<number>();
      for (let after = -1; ;) {
        const page = await this.uow.repos.exports.framesPage(clip.id, clip.model, after, PAGE * 4);
        for (const f of page) {
          if (f.corrected) corrected.add(f.frameIndex);
          if (f.careful) careful.add(f.frameIndex);
        }
        if (page.length < PAGE * 4) break;
        after = page[page.length - 1].frameIndex;
      }
      for (const [i, f] of (series?.frames ?? []).entries()) {
        if (stopped()) return;
        sink.emit(
          row(
            f.frameIndex,
            f.timeMs,
            corrected.has(f.frameIndex),
            careful.has(f.frameIndex),
            f.metrics,
            f.keypoints,
          ),
        );
        if (i % PAGE === PAGE - 1) await sink.flush();
      }
      return;
    }
    for (let after = -1; ;) {
      if (stopped()) return;
      const page = await this.uow.repos.exports.framesPage(clip.id, clip.model, after, PAGE);
      for (const f of page) {
        sink.emit(
          row(
            f.frameIndex,
            f.timeMs,
            f.corrected === 1,
            f.careful === 1,
            JSON.parse(f.metrics) as Partial<Record<MetricKey, number | null>>,
            JSON.parse(f.keypoints) as Keypoint[],
          ),
        );
      }
      await sink.flush();
      if (page.length < PAGE) return;
      after = page[page.length - 1].frameIndex;
    }
  }

  private async keypointRows(
    clip: ExportClip,
    lead: Cell[],
    sink: Sink,
    stopped: () => boolean,
  ): Promise<void> {
    for (let after = -1; ;) {
      if (stopped()) return;
      const page = await this.uow.repos.exports.framesPage(clip.id, clip.model, after, PAGE);
      for (const f of page) {
        for (const k of JSON.parse(f.keypoints) as Keypoint[]) {
          sink.emit([
            ...lead,
            f.frameIndex,
            f.timeMs,
            k.name,
            k.x,
            k.y,
            k.score,
            f.corrected === 1,
            f.careful === 1,
            clip.width,
            clip.height,
          ]);
        }
      }
      await sink.flush();
      if (page.length < PAGE) return;
      after = page[page.length - 1].frameIndex;
    }
  }

  private async turnRows(clip: ExportClip, lead: Cell[], sink: Sink): Promise<void> {
    const { series, flags } = await this.frames.read(await this.clipRow(clip.id), clip.model);
    const apexKeys = METRIC_KEYS.filter((key) => METRIC_DEFINITIONS[key].views.includes('front'));
    for (const turn of series?.turns ?? []) {
      const own = flags.filter((f) => f.turnIndex === turn.index);
      sink.emit([
        ...lead,
        turn.index,
        turn.direction,
        turn.complete,
        turn.startMs,
        turn.apexMs,
        turn.endMs,
        turn.durationMs,
        ...apexKeys.map((key) => turn.apexValues[key]),
        turn.transitionRise,
        turn.insideShoulderDrop,
        new Set(own.map((f) => f.metric)).size,
        [...new Set(own.map((f) => f.metric))].sort().join(';'),
      ]);
    }
    await sink.flush();
  }

  private async clipRow(id: string) {
    const clip = await this.uow.repos.clips.findById(id);
    if (!clip) throw notFound('Clip');
    return clip;
  }

  /** The clips the caller may see that the filters cover; a named clip outside them is 404. */
  private async clips(principal: Principal, query: ExportQuery): Promise<ExportClip[]> {
    const visibleAthleteIds = await this.access.visibleAthleteIds(principal);
    const clips = await this.uow.repos.exports.clips({
      clubId: principal.clubId,
      visibleAthleteIds,
      clipId: query.clipId,
      athleteId: query.athleteId,
      sessionId: query.sessionId,
      ageGroupId: query.ageGroupId,
      from: query.from,
      to: query.to,
      view: query.view,
    });
    // Athletes and guardians export what reviews have shared with them; withdrawn consent hides clips.
    const shown = (await this.access.clipReach(principal)).filter(clips);
    if (query.clipId && shown.length === 0) {
      // Another club's clip, one the caller may not see, and a clip outside the other filters look alike.
      throw notFound('Clip');
    }
    return shown;
  }

  /** The first tagged athlete of each clip that the caller may see (teammates stay hidden). */
  private async firstVisibleAthletes(
    principal: Principal,
    clips: ExportClip[],
  ): Promise<Map<string, string>> {
    const visible = await this.access.visibleAthleteIds(principal);
    const tags = await this.uow.repos.clips.athleteIdsByClip(clips.map((c) => c.id));
    const out = new Map<string, string>();
    for (const [clipId, ids] of tags) {
      const first = ids.find((id) => visible === null || visible.includes(id));
      if (first) out.set(clipId, first);
    }
    return out;
  }
}

/**
 * Resolves when `out` drains or closes. The listener of the event that did not happen is removed, or
 * a long download would leave two listeners on the response for every wait.
 */
async function drainedOrClosed(out: Writable): Promise<void> {
  const done = new AbortController();
  const wait = (event: string) => once(out, event, { signal: done.signal }).catch(() => undefined);
  await Promise.race([wait('drain'), wait('close')]);
  done.abort();
}
