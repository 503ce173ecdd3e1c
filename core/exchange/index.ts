// Exchange formats for office systems.
export { csvField, csvDocument, readingsToCsv, type ReadingCsvOptions, type ReadingExportRow } from './readings-csv';
export { BUNDLE_FORMAT, BUNDLE_VERSION, BundleError, bundleChecksum, makeBundle, parseBundle, type Bundle, type BundleErrorReason, type BundleInput } from './bundle';
export { sha256Hex, utf8Bytes } from './sha256';
