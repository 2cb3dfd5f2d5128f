// A coach who turns a clip's facing while the server analyses it: the frames stored so far are swapped
// at once (the clip's facing changed), and the job's later frames are swapped to match, so every frame
// ends with the skier's own sides. Checked against the analyze CLI's committed points of the same
// footage (fixtures/media/demo, read facing the camera), with left and right swapped.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto, ServerAnalysisResponse } from '@shared/schemas/clip.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { settled } from './clip-fixtures';
import { uploadDemoFootage, worstGapToCommitted } from './demo-footage';

let server: TestServer;

beforeAll(async () => {
  // A pause between batches of ten frames, so the change lands part way through the clip.
  server = await createTestServer({ ANALYSIS_WORKERS: '1', AUTO_ANALYSIS: 'on', JOB_STEP_PAUSE: '400ms' });
}, 120_000);
afterAll(async () => {
  await server?.close();
});

describe('turning the facing while the server analyses the clip', () => {
  it(
    'leaves every frame with the skier’s own sides, before and after the change',
    { timeout: 180_000 },
    async () => {
      const uploaded = await uploadDemoFootage(server, 'phantom-front-turns', {
        athlete: 'Elsie',
        view: 'front',
      });
      await settled(server, uploaded.id);
      const status = async () =>
        (await server.http.get(`/api/clips/${uploaded.id}/server-analysis`).set(await server.bearer('coach')))
          .body as ServerAnalysisResponse;
      // Part way: some batches stored, more to come.
      for (let s = await status(); (s.serverAnalysis?.done ?? 0) < 30; s = await status()) {
        expect(s.serverAnalysis?.status).not.toBe('done');
        await new Promise((r) => setTimeout(r, 100));
      }
      const turned = await server.http
        .patch(`/api/clips/${uploaded.id}`)
        .set(await server.bearer('coach'))
        .send({ facing: 'away' });
      expect(turned.status).toBe(200);
      expect((turned.body.clip as ClipDto).serverAnalysis?.status).toBe('running');
      await server.runtime.analyses.idle();

      const read = (
        await server.http
          .get(`/api/clips/${uploaded.id}/frames?model=lightning`)
          .set(await server.bearer('coach'))
      ).body as ClipFramesResponse;
      expect(read.frames).toHaveLength(uploaded.frameCount!);
      const { worst, compared } = await worstGapToCommitted(server, uploaded.id, 'phantom-front-turns', {
        swapSides: true,
      });
      expect(compared).toBeGreaterThan(1000);
      // Every frame, stored before the change or after it, is the CLI's read with the sides swapped.
      expect(worst).toBeLessThan(0.05);
    },
  );
});
