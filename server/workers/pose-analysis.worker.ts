// Reads one clip's video with the shared pose detector (Node, WASM backend) in a worker thread, so the
// API keeps answering while a clip is analysed on the server. One request per thread:
//   in:  PoseAnalysisRequest
//   out: { type: 'frames', frames } per batch, then { type: 'done' } or { type: 'error', message }.
import { parentPort, workerData } from 'node:worker_threads';
import { orientKeypoints } from '../../shared/pose/keypoint-mapping';
import { analyzeMediaFile } from '../pose/analyze-media';
import type { PoseAnalysisMessage, PoseAnalysisRequest } from './pose-analysis-pool';

const request = workerData as PoseAnalysisRequest;
const post = (message: PoseAnalysisMessage) => parentPort?.postMessage(message);

try {
  let batch: Extract<PoseAnalysisMessage, { type: 'frames' }>['frames'] = [];
  for await (const f of analyzeMediaFile(request.path, {
    model: request.model,
    every: 1,
    pick: request.pick,
    fromFrame: request.fromFrame,
    careful: request.careful,
  })) {
    if (f.frame === null) continue;
    batch.push({
      frameIndex: f.frame,
      timeMs: f.timeMs ?? (request.fps ? (f.frame / request.fps) * 1000 : 0),
      // The skier's own sides, as the browser stores them (a clip filmed from behind is swapped back).
      keypoints: orientKeypoints(f.keypoints, request.facing),
    });
    if (batch.length >= request.batchSize) {
      post({ type: 'frames', frames: batch });
      batch = [];
    }
  }
  if (batch.length > 0) post({ type: 'frames', frames: batch });
  post({ type: 'done' });
} catch (error) {
  post({ type: 'error', message: error instanceof Error ? error.message : String(error) });
}
