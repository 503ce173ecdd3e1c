// Exchange formats for office systems.
export { csvField, csvDocument, readingsToCsv, type ReadingCsvOptions, type ReadingExportRow } from './readings-csv';
