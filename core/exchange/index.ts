// Exchange formats for office systems: bundles, CSV tables (RFC 4180), CSV readings import, WaterML 2.0.
export { CSV_BOM, csvField, csvDocument, csvTable, csvNumber, textField, looksLikeFormula, type CsvColumn, type CsvColumnKind } from './csv-write';
export { DISCHARGE_DIGITS, readingsToCsv, type ReadingCsvOptions, type ReadingExportRow } from './readings-csv';
export { stageExportRows } from './stage-rows';
export { gaugingsToCsv, type SiteCsvOptions } from './gaugings-csv';
export { printedRatingTable, ratingSegmentsToCsv, ratingTablesToCsv, RATING_TABLE_HEADROOM_M, type RatingTableCsvOptions } from './ratings-csv';
export { gaugingVerticalsToCsv } from './gauging-verticals-csv';
export { stormToCsv, type SeparatedStorm } from './storm-csv';
export { DEFAULT_BUNDLE_BYTES, MIN_BUNDLE_BYTES, MAX_BUNDLE_BYTES_HEADER, bundleBudget, recordsThatFit, statedLimit_bytes, utf8Length, type BundleLimits } from './bundle-size';
export { BUNDLE_FORMAT, BUNDLE_VERSION, BundleError, bundleChecksum, bundleRecordProblem, makeBundle, parseBundle, type Bundle, type BundleErrorReason, type BundleInput } from './bundle';
export { sha256Hex, utf8Bytes } from './sha256';
export { bundleJson, withoutBom } from './text-file';
export { MAX_BUNDLE_DEPTH, nestedDeeperThan } from './nesting';
export { escapeXml, gmlId } from './xml-write';
export { watermlTimeseries, WATERML_QUALITY, type TimeseriesDocumentInput } from './waterml-timeseries';
export { watermlRatings, segmentEquation, type RatingsDocumentInput } from './waterml-ratings';
export { ratingConversionPoints, chordGap, DEFAULT_CONVERSION_TOLERANCE, type ConversionPoint, type ConversionTolerance } from './rating-points';
export { readCsvRecords, CsvSyntaxError, type CsvRecord } from './csv-read';
export {
  parseReadingsCsv, parseIsoWithOffset, CsvImportError, MAX_CSV_PROBLEMS, type ReadingCsvMapping, type CsvProblem, type CsvStageUnit,
} from './readings-csv-import';
export { guessReadingsMapping, type MappingGuess } from './readings-csv-mapping';
export { isoWithOffsetFormatter } from './iso-times';
export {
  LOGGER_TIME_FORMATS, LOGGER_LEVEL_UNITS, STANDARD_GRAVITY_MPS2, FRESH_WATER_DENSITY_KGM3, metresPerLevelUnit, checkLoggerMapping,
  type LoggerMapping, type LoggerClock, type LoggerTimeFormat, type LoggerLevelUnit,
} from './logger-mapping';
export { parseStamp, stampParser, zoneResolver, type ParsedStamp } from './logger-stamps';
export {
  loggerReader, type LoggerReader, type LoggerRows, type LoggerProblem, type LoggerDuplicate, type RepeatedHourLines, type BackwardStep,
} from './logger-reader';
export { tidyLoggerRows, type LoggerSeries } from './logger-tidy';
export { driftTable, driftCorrections, loggerValueAt, type DriftCheck, type DriftTableRow } from './logger-drift';
export {
  LOGGER_DAY_MS, loggerDayId, splitLoggerDays, mergeLoggerDay, loggerDayStages, type CorrectedLogger, type LoggerDayContext, type LoggerDayMerge,
} from './logger-days';
export { loggerGaps, type LoggerGap } from './logger-gaps';
export { base64Decode, base64DecodedLength, base64Encode } from './base64';
export {
  BUNDLE_BLOBS_FIELD, BundleBlobError, bundleFileParts, decodeBundleBlobs, encodeBundleBlobs, refuseBundleBlobs,
  type BlobBytes, type BundleBlobsField,
} from './bundle-blobs';
export { photoExtension, photoFilesByOwner, photoNamer } from './photo-names';
