export { NotesPanel } from './notes-panel';
