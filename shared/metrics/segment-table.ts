// de Leva (1996), J Biomech 29(9):1223-1230, adjustments to Zatsiorsky-Seluyanov's segment
// inertia parameters. Mass as a fraction of body mass; CoM as a fraction of segment length from
// the first endpoint. Trunk uses the mid-shoulder→mid-hip row and shank the knee→ankle joint
// centre row, because those are the endpoints a pose model gives.

export interface SegmentParameters {
  mass: number;
  com: number;
}

export interface SegmentTable {
  name: string;
  source: string;
  headNeck: SegmentParameters;
  trunk: SegmentParameters;
  upperArm: SegmentParameters;
  forearm: SegmentParameters;
  hand: SegmentParameters;
  thigh: SegmentParameters;
  shank: SegmentParameters;
  foot: SegmentParameters;
}

const SOURCE = 'de Leva 1996, J Biomech 29(9):1223-1230';

export const DE_LEVA_MALE: SegmentTable = {
  name: 'de-leva-male',
  source: SOURCE,
  headNeck: { mass: 0.0694, com: 0.5002 },
  trunk: { mass: 0.4346, com: 0.431 },
  upperArm: { mass: 0.0271, com: 0.5772 },
  forearm: { mass: 0.0162, com: 0.4574 },
  hand: { mass: 0.0061, com: 0.79 },
  thigh: { mass: 0.1416, com: 0.4095 },
  shank: { mass: 0.0433, com: 0.4395 },
  foot: { mass: 0.0137, com: 0.4415 },
};

export const DE_LEVA_FEMALE: SegmentTable = {
  name: 'de-leva-female',
  source: SOURCE,
  headNeck: { mass: 0.0668, com: 0.4841 },
  trunk: { mass: 0.4257, com: 0.3782 },
  upperArm: { mass: 0.0255, com: 0.5754 },
  forearm: { mass: 0.0138, com: 0.4559 },
  hand: { mass: 0.0056, com: 0.7474 },
  thigh: { mass: 0.1478, com: 0.3612 },
  shank: { mass: 0.0481, com: 0.4352 },
  foot: { mass: 0.0129, com: 0.4014 },
};

export type SegmentTableName = 'de-leva-male' | 'de-leva-female';

export const SEGMENT_TABLES: Record<SegmentTableName, SegmentTable> = {
  'de-leva-male': DE_LEVA_MALE,
  'de-leva-female': DE_LEVA_FEMALE,
};
