export * from './bands';
export * from './band-metrics';
export * from './flag-groups';
