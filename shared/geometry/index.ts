export * from './types';
export * from './vector';
export * from './angles';
export * from './reference-frame';
export * from './align-to-line';
