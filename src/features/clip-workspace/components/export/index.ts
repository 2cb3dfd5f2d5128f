export { ExportMenu } from './export-menu';
