export { AnalysisPanel } from './analysis-panel';
