// Storm analyses saved by the technician or the office.
import type { AnalysisRecord } from '../../core/records/index';
import { listRange, saveIn, tombstoneIn, type ReadOptions, type SaveInput } from './records';

/** Validates and saves a storm analysis (new id when absent); resolves once it is durable. */
export const saveAnalysis = (analysis: SaveInput<AnalysisRecord>): Promise<AnalysisRecord> => saveIn('analyses', analysis);
/** Deletes an analysis by tombstone; returns the tombstone. */
export const deleteAnalysis = (id: string): Promise<AnalysisRecord | undefined> => tombstoneIn('analyses', id);

/** Analyses of a site whose window starts within [from_ms, to_ms] (UTC ms; all by default), oldest first. */
export function listAnalyses(siteId: string, from_ms = -Infinity, to_ms = Infinity, options?: ReadOptions): Promise<AnalysisRecord[]> {
  return listRange('analyses', 'by-site-from', [siteId, from_ms], [siteId, to_ms], options);
}
