// Entry of a pose-analysis worker thread: the app runs its TypeScript through tsx, and a worker thread
// starts without the parent's loader, so it registers tsx itself before loading the worker's code.
import { register } from 'tsx/esm/api';

register();
await import('./pose-analysis.worker.ts');
