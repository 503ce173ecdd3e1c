// Exchange formats for office systems: CSV tables (RFC 4180), CSV readings import, WaterML 2.0.
export { CSV_BOM, csvField, csvDocument, csvTable, csvNumber, textField, looksLikeFormula, type CsvColumn, type CsvColumnKind } from './csv-write';
export { readingsToCsv, type ReadingCsvOptions, type ReadingExportRow } from './readings-csv';
export { gaugingsToCsv, type SiteCsvOptions } from './gaugings-csv';
export { ratingSegmentsToCsv, ratingTablesToCsv, RATING_TABLE_HEADROOM_M } from './ratings-csv';
export { stormToCsv, type SeparatedStorm } from './storm-csv';
