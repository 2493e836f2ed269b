// Reading a cycler's CSV log into LogColumns: sniff the layout, confirm a mapping, parse streaming.
export * from "./column-mapping";
export * from "./log-import-error";
export { detectWrongFileType, fileTypeProbeBytes } from "./detect-file-type";
export { sniffLog, sniffBytes, type LogSniff, type LogSniffResult, type PreviewRow } from "./sniff-log";
export { proposeMapping, readHeaderName, type MappingDraft, type MappingProposal } from "./propose-mapping";
export { createLogParser, parseLog, parseLogAsync, type LogParser, type LogParserOptions, type LogParseResult, type LogProgress, type ParsedLog } from "./parse-log";
export { readNumber, readTimestamp } from "./read-cell";
export { splitLine } from "./split-line";
export { createScanFloor, type ScanFloor } from "./scan-floor";
