// Keep and share a storm: save the analysis with everything needed to repeat it, share the plot with its
// figures as a picture, and the separated series as CSV.
import { useState } from 'preact/hooks';
import { stormToCsv, type AnalysisResults, type EventPoints, type EventSummary, type SiteRecord } from '../../../core';
import type { PlotApi } from '../../components/Plot';
import { METHOD_LABELS } from '../../components/SeparationPicker';
import { saveAnalysis } from '../../db';
import { formatQuantity, formatTime, significant } from '../../format';
import type { StormResult, StormSeries } from './analysis';
import type { StormAction, StormDraft, TimeWindow } from './draft';
import { KEY_NAMES, KEY_ORDER } from './key-point-order';
import { rangeText } from './results-strip';
import type { RunoffRange } from './runoff-range';
import { canvasToPng, composePicture, shareOrDownload } from './share';
import { plainError } from '../../plain-words';

function resultsOf(s: EventSummary): AnalysisResults {
  const { notes: _notes, ...figures } = s;
  return figures;
}

/** Props: what the analysis is made of and the plot to picture. */
export interface StormActionsProps {
  site: SiteRecord;
  draft: StormDraft;
  dispatch: (a: StormAction) => void;
  window: TimeWindow;
  points: EventPoints;
  result: StormResult;
  series: StormSeries;
  rainfall_mm?: number;
  rangeLine?: RunoffRange;
  plot: () => PlotApi | undefined;
}

type Status = { kind: 'idle' } | { kind: 'busy'; what: string } | { kind: 'done'; text: string } | { kind: 'failed'; text: string };

/** Save, share picture, share CSV. */
export function StormActions(p: StormActionsProps) {
  const [status, setStatus] = useState<Status>({ kind: 'idle' });
  const units = p.site.displayUnits;
  const zone = p.site.timeZone;
  const s = p.result.summary;
  const day = formatTime(p.points.peak_ms, zone).slice(0, 10);
  const base = `freshet-storm-${p.site.code.replace(/[^\w-]+/g, '_')}-${day}`;

  const run = async (what: string, fn: () => Promise<string>) => {
    setStatus({ kind: 'busy', what });
    try {
      setStatus({ kind: 'done', text: await fn() });
    } catch (e) {
      setStatus({ kind: 'failed', text: plainError(e, { doing: 'save' }) });
    }
  };

  const save = () =>
    run('Saving…', async () => {
      const saved = await saveAnalysis({
        ...(p.draft.reopened ? { id: p.draft.reopened } : {}),
        siteId: p.site.id,
        from_ms: p.window.from_ms,
        to_ms: p.window.to_ms,
        method: { ...p.result.method },
        points: p.points,
        ...(p.site.area_km2 === undefined ? {} : { area_km2: p.site.area_km2 }),
        ...(p.rainfall_mm === undefined ? {} : { rainfall_mm: p.rainfall_mm }),
        results: resultsOf(s),
        note: p.draft.note.trim(),
      });
      p.dispatch({ type: 'saved', id: saved.id });
      return `Saved on this phone at ${formatTime(Date.now(), zone)}.`;
    });

  const picture = () =>
    run('Making the picture…', async () => {
      const api = p.plot();
      if (!api) throw new Error('The plot is not drawn yet.');
      api.flush();
      const lines = [
        `${METHOD_LABELS[p.result.method.kind]}: direct runoff ${formatQuantity('volume', s.directVolume_m3, units)}${p.rangeLine ? `, ${rangeText(p.rangeLine, units)}` : ''}`,
        `Depth ${formatQuantity('depth', s.runoffDepth_mm, units)} · peak ${formatQuantity('discharge', s.peak_m3s, units)} · baseflow index ${significant(s.baseflowIndex, 2)}${
          s.runoffCoefficient === undefined ? '' : ` · coefficient ${significant(s.runoffCoefficient, 2)}`
        }`,
        KEY_ORDER.slice(0, 2).map((k) => `${KEY_NAMES[k]} ${formatTime(p.points[k], zone)}`).join(' · '),
        KEY_ORDER.slice(2).map((k) => `${KEY_NAMES[k]} ${formatTime(p.points[k], zone)}`).join(' · '),
        `Times in ${zone}. Estimates: check against local methods before use.`,
      ];
      const canvas = composePicture(api.canvas(), `${p.site.code} · ${p.site.name} · storm of ${day}`, lines, api.canvas().width / Math.max(1, api.canvas().clientWidth || api.canvas().width));
      const how = await shareOrDownload(await canvasToPng(canvas, `${base}.png`));
      return how === 'shared' ? 'The picture was handed to the share sheet.' : how === 'downloaded' ? `The picture was saved as ${base}.png.` : 'Sharing was cancelled.';
    });

  const csv = () =>
    run('Making the CSV…', async () => {
      // The core's storm CSV neutralises text that a spreadsheet would run as a formula (the site code, the method).
      const text = stormToCsv({ series: p.series, baseflow_m3s: p.result.baseflow_m3s, method: METHOD_LABELS[p.result.method.kind] }, { siteCode: p.site.code, timeZone: zone, units });
      const how = await shareOrDownload(new File([text], `${base}.csv`, { type: 'text/csv' }));
      return how === 'shared' ? 'The CSV was handed to the share sheet.' : how === 'downloaded' ? `The CSV was saved as ${base}.csv.` : 'Sharing was cancelled.';
    });

  return (
    <section class="storm-actions" aria-labelledby="storm-save-heading">
      <h3 id="storm-save-heading">Keep and share</h3>
      <label for="storm-note">Note (optional)</label>
      <textarea id="storm-note" value={p.draft.note} onInput={(e) => p.dispatch({ type: 'note', text: e.currentTarget.value })} />
      <button type="button" class="primary wide" disabled={status.kind === 'busy'} onClick={() => void save()}>
        {p.draft.reopened ? 'Save changes to this analysis' : 'Save this analysis'}
      </button>
      <div class="storm-share">
        <button type="button" disabled={status.kind === 'busy'} onClick={() => void picture()}>Share picture</button>
        <button type="button" disabled={status.kind === 'busy'} onClick={() => void csv()}>Share CSV</button>
      </div>
      <div role="status" aria-live="polite">
        {status.kind === 'busy' && <p class="muted">{status.what}</p>}
        {status.kind === 'done' && <p class="callout ok" data-testid="storm-action-done">{status.text}</p>}
      </div>
      {status.kind === 'failed' && <p class="callout bad" role="alert">Not done: {status.text}</p>}
    </section>
  );
}
