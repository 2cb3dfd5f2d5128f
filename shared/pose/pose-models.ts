import type { PoseModelName } from '../keypoints';

/** A folder under models/ (served at `/models/<dir>/model.json`). */
export type ModelDir = 'movenet-lightning' | 'movenet-thunder' | 'blazepose-detector' | 'blazepose-full';

export interface PoseModelInfo {
  name: PoseModelName;
  label: string;
  /** Graph models the detector loads, in the order pose-detection wants them. */
  dirs: readonly ModelDir[];
  /** Network input in pixels (width = height); the detector crops and resizes frames to it. */
  inputSize: number;
  keypointCount: 17 | 33;
}

export const POSE_MODEL_INFO: Record<PoseModelName, PoseModelInfo> = {
  lightning: {
    name: 'lightning',
    label: 'MoveNet Lightning (fast)',
    dirs: ['movenet-lightning'],
    inputSize: 192,
    keypointCount: 17,
  },
  thunder: {
    name: 'thunder',
    label: 'MoveNet Thunder (accurate)',
    dirs: ['movenet-thunder'],
    inputSize: 256,
    keypointCount: 17,
  },
  blazepose: {
    name: 'blazepose',
    label: 'BlazePose full (33 points with heels and foot tips)',
    dirs: ['blazepose-detector', 'blazepose-full'],
    inputSize: 256,
    keypointCount: 33,
  },
};

/** Path of a model on the app's own origin. */
export function modelUrl(dir: ModelDir, base = '/models'): string {
  return `${base.replace(/\/$/, '')}/${dir}/model.json`;
}
