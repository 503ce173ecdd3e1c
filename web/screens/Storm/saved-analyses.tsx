// The storm analyses saved for a site: event date, method and direct runoff volume, each with delete.
import { useState } from 'preact/hooks';
import type { AnalysisRecord, UnitSystem } from '../../../core';
import { METHOD_LABELS, METHOD_KINDS, type MethodKind } from '../../components/SeparationPicker';
import { deleteAnalysis, listAnalyses } from '../../db';
import { formatQuantity, formatTime } from '../../format';
import { useRecords } from '../../db/use-records';

function methodName(kind: string): string {
  return (METHOD_KINDS as readonly string[]).includes(kind) ? METHOD_LABELS[kind as MethodKind] : kind;
}

/** The saved analyses of one site, newest event first, with a delete button each (a tombstone). */
export function SavedAnalyses({ siteId, units, timeZone }: { siteId: string; units: UnitSystem; timeZone: string }) {
  const saved = useRecords(() => listAnalyses(siteId), ['analysis'], [siteId]);
  const [problem, setProblem] = useState<string>();
  const [busy, setBusy] = useState<string>();
  const remove = async (a: AnalysisRecord) => {
    setBusy(a.id);
    setProblem(undefined);
    try {
      await deleteAnalysis(a.id);
    } catch (e) {
      setProblem(e instanceof Error ? e.message : String(e));
    } finally {
      setBusy(undefined);
    }
  };
  return (
    <section aria-labelledby="storm-saved-heading">
      <h3 id="storm-saved-heading">Saved analyses of this site</h3>
      {saved.state === 'loading' && <p class="muted">Reading saved analyses…</p>}
      {saved.state === 'failed' && <p class="callout bad">{saved.message}</p>}
      {problem && <p class="callout bad" role="alert">{problem}</p>}
      {saved.state === 'ready' && saved.value.length === 0 && <p class="muted">None saved yet.</p>}
      {saved.state === 'ready' && saved.value.length > 0 && (
        <ul class="list storm-saved" data-testid="saved-analyses">
          {[...saved.value]
            .sort((a, b) => b.points.peak_ms - a.points.peak_ms)
            .map((a) => {
              const when = formatTime(a.points.peak_ms, timeZone);
              return (
                <li key={a.id} class="item">
                  <div class="storm-saved-text">
                    <strong>Peak {when}</strong>
                    <span>{methodName(a.method.kind)}</span>
                    <span>Direct runoff {formatQuantity('volume', a.results.directVolume_m3, units)}</span>
                    {a.note && <span class="muted">{a.note}</span>}
                  </div>
                  <button
                    type="button"
                    class="danger"
                    disabled={busy === a.id}
                    aria-label={`Delete the analysis with peak ${when}`}
                    onClick={() => void remove(a)}
                  >
                    Delete
                  </button>
                </li>
              );
            })}
        </ul>
      )}
    </section>
  );
}
