// Test-side entry to the log generator, so tests across the project build logs the same way.
export { generateSyntheticLog, type SyntheticLog, type SyntheticLogOptions, type SyntheticStep } from "@/lib/analysis/synthetic-log";
export { formatLogCsv, writeLogCsv, type CsvFormat } from "@/lib/analysis/write-log-csv";
