export { analyzeStream, type AnalyzeStreamOptions, type IngestProgress } from './analyze-stream';
export { analyzeFile } from './analyze-file';
