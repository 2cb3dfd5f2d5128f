export { NotesPanel } from './notes-panel';
export { DrawingLayer } from './drawing-layer';
