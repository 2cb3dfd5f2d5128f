export { CurvesPanel } from './curves-panel';
export { TurnTable } from './turn-table';
