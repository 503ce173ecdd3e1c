// The storm analyses saved for a site: event date, method and direct runoff volume, each to open again or delete.
import { useState } from 'preact/hooks';
import type { AnalysisRecord, UnitSystem } from '../../../core';
import { METHOD_LABELS, METHOD_KINDS, type MethodKind } from '../../components/SeparationPicker';
import { deleteAnalysis, listAnalyses } from '../../db';
import { formatQuantity, formatTime } from '../../format';
import { useRecords } from '../../components/use-records';
import { draftFromAnalysis, type StormDraft } from './draft';
import { plainError } from '../../plain-words';

function methodName(kind: string): string {
  return (METHOD_KINDS as readonly string[]).includes(kind) ? METHOD_LABELS[kind as MethodKind] : kind;
}

/** Props: the site, its units and zone, the analysis open now, and the open callback. */
export interface SavedAnalysesProps {
  siteId: string;
  units: UnitSystem;
  timeZone: string;
  openId?: string;
  onOpen: (draft: StormDraft) => void;
}

/** The saved analyses of one site, newest event first, each with Open and Delete (a tombstone). */
export function SavedAnalyses({ siteId, units, timeZone, openId, onOpen }: SavedAnalysesProps) {
  const saved = useRecords(() => listAnalyses(siteId), ['analysis'], [siteId]);
  const [problem, setProblem] = useState<string>();
  const [busy, setBusy] = useState<string>();
  const remove = async (a: AnalysisRecord) => {
    setBusy(a.id);
    setProblem(undefined);
    try {
      await deleteAnalysis(a.id);
    } catch (e) {
      setProblem(plainError(e, { doing: 'save' }));
    } finally {
      setBusy(undefined);
    }
  };
  const open = (a: AnalysisRecord) => {
    const d = draftFromAnalysis(a, units);
    if (d) {
      setProblem(undefined);
      onOpen(d);
      scrollTo({ top: 0 });
    } else setProblem(`This analysis uses a method this version does not know (${a.method.kind}); it cannot be opened here.`);
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
                    <strong>Peak {when}{a.id === openId ? ' (open)' : ''}</strong>
                    <span>{methodName(a.method.kind)}</span>
                    <span>Direct runoff {formatQuantity('volume', a.results.directVolume_m3, units)}</span>
                    {a.note && <span class="muted">{a.note}</span>}
                  </div>
                  <div class="storm-saved-buttons">
                    <button type="button" aria-label={`Open the analysis with peak ${when}`} onClick={() => open(a)}>
                      Open
                    </button>
                    <button type="button" class="danger" disabled={busy === a.id} aria-label={`Delete the analysis with peak ${when}`} onClick={() => void remove(a)}>
                      Delete
                    </button>
                  </div>
                </li>
              );
            })}
        </ul>
      )}
    </section>
  );
}
