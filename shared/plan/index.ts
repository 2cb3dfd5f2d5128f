export * from './progress';
export * from './target';
