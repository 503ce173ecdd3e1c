// Importing the office's rating table (CSV of stage, discharge): fitted to one or two segments with the
// fit's standard error, or kept as the table itself with log–log interpolation between its rows.
import { useMemo, useState } from 'preact/hooks';
import { fitSegments, fromDisplay, ratingFromTable, toDisplay, toLocalInput, type Rating, type SiteRecord } from '../../../core';
import { saveRating } from '../../db';
import { Field } from '../../components/Field';
import { formatQuantity, parseDecimal } from '../../format';
import { href, navigate } from '../../router';
import { segmentFormula, unitLabels } from './describe';
import { NumberField } from '../../components/NumberField';
import { plainFitMessage } from './fit-choice';
import { plainError } from '../../plain-words';
import { readValidFrom } from './rating-form';
import { parseTableCsv, TableCsvError, type ParsedTable } from './table-csv';

type Keep = 'fit1' | 'fit2' | 'table';

/** The table import screen of one site. */
export function ImportTable({ site }: { site: SiteRecord }) {
  const u = site.displayUnits;
  const { su } = unitLabels(u);
  const [text, setText] = useState('');
  const [keepAs, setKeepAs] = useState<Keep>('fit1');
  const [breakpointText, setBreakpointText] = useState('');
  const [offsetText, setOffsetText] = useState('');
  const [validFromText, setValidFromText] = useState(() => toLocalInput(Date.now(), site.timeZone));
  const [rangeText, setRange] = useState<[string, string]>(['', '']);
  const [failure, setFailure] = useState<string>();
  const table = useMemo((): { ok: true; t: ParsedTable } | { ok: false; error: string } | undefined => {
    if (!text.trim()) return undefined;
    try {
      return { ok: true, t: parseTableCsv(text, u) };
    } catch (err) {
      if (err instanceof TableCsvError) return { ok: false, error: plainError(err) };
      throw err;
    }
  }, [text, u]);
  const result = useMemo((): { rating: Rating; se?: number; warnings: string[] } | { error: string; field: string } | undefined => {
    if (!table?.ok) return undefined;
    const rows = table.t.rows;
    try {
      if (keepAs === 'table') {
        const typed = offsetText.trim() ? parseDecimal(offsetText) : undefined;
        if (offsetText.trim() && typed === undefined) return { field: 'tableOffset', error: `Type the offset as a number in ${su}, or leave it blank to use the table’s dry row.` };
        return { rating: ratingFromTable(rows, typed === undefined ? undefined : fromDisplay('stage', typed, u)), warnings: [] };
      }
      const pts = rows.filter((r) => r.discharge_m3s > 0).map((r) => ({ stage_m: r.stage_m, discharge_m3s: r.discharge_m3s }));
      const bp = keepAs === 'fit2' ? parseDecimal(breakpointText) : undefined;
      if (keepAs === 'fit2' && bp === undefined) return { field: 'tableBreakpoint', error: `Type the breakpoint as a stage in ${su}.` };
      const fit = fitSegments(pts, bp === undefined ? {} : { breakpoint_m: fromDisplay('stage', bp, u), join: true });
      return { rating: { segments: fit.rating.segments }, se: fit.standardError_pct, warnings: fit.warnings.filter((w) => !/^(Lower segment: |Upper segment: )?Only \d+ gaugings/.test(w)) };
    } catch (err) {
      return { field: keepAs === 'table' ? 'tableOffset' : keepAs === 'fit2' ? 'tableBreakpoint' : 'csv', error: plainError(err, { units: u, fallback: 'This table does not give a rating; check its stages, discharges and the offset.' }) };
    }
  }, [table, keepAs, breakpointText, offsetText, u, su]);

  async function onFile(e: Event) {
    const file = (e.currentTarget as HTMLInputElement).files?.[0];
    if (file) setText(await file.text());
  }

  async function save() {
    setFailure(undefined);
    if (!result || 'error' in result || !table?.ok) return;
    const from = readValidFrom(validFromText, site.timeZone, Date.now());
    if (!from.ok) {
      setFailure('Not saved: give the date and time the rating applies from, not in the future.');
      return;
    }
    const { validFrom_ms } = from;
    const lo = rangeText[0].trim() ? parseDecimal(rangeText[0]) : undefined;
    const hi = rangeText[1].trim() ? parseDecimal(rangeText[1]) : undefined;
    if ((rangeText[0].trim() && lo === undefined) || (rangeText[1].trim() && hi === undefined) || (lo === undefined) !== (hi === undefined) || (lo !== undefined && hi !== undefined && lo > hi)) {
      setFailure(`Not saved: give both ends of the gauged range as numbers in ${su} (lowest first), or neither.`);
      return;
    }
    try {
      const saved = await saveRating({
        siteId: site.id, validFrom_ms, segments: result.rating.segments,
        ...(lo !== undefined && hi !== undefined && { gaugedRange_m: [fromDisplay('stage', lo, u), fromDisplay('stage', hi, u)] as [number, number] }),
        shifts: [], fittedFrom: [],
        note: keepAs === 'table' ? `Imported table of ${table.t.rows.length} rows, log–log interpolation between rows.` : `Fitted to an imported table of ${table.t.rows.length} rows (standard error ${result.se?.toFixed(2)} %).`,
      });
      navigate(href('sites', site.id, 'ratings', saved.id), true);
    } catch (err) {
      setFailure(`Not saved: ${plainError(err, { doing: 'save' })}`);
    }
  }

  const fieldError = result && 'error' in result ? result : undefined;
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Import a rating table</h2>
      <p class="muted">A CSV with a stage and a discharge on each line, lowest stage first; a header naming the units (m or ft, m³/s or ft³/s) is used when present, else {su} and the site’s discharge unit.</p>
      <Field id="csvFile" label="Table file">
        <input id="csvFile" type="file" accept=".csv,text/csv,text/plain" onChange={(e) => void onFile(e)} />
      </Field>
      <Field id="csv" label="Or paste the table" error={table && !table.ok ? table.error : fieldError?.field === 'csv' ? fieldError.error : undefined}>
        <textarea id="csv" value={text} rows={6} onInput={(e) => setText(e.currentTarget.value)} aria-invalid={table && !table.ok ? true : undefined} />
      </Field>
      {table?.ok && (
        <>
          <p data-testid="table-summary">{table.t.rows.length} rows from {formatQuantity('stage', table.t.rows[0].stage_m, u)} to {formatQuantity('stage', table.t.rows[table.t.rows.length - 1].stage_m, u)} (file in {table.t.stageUnit} and {table.t.dischargeUnit}).</p>
          <fieldset>
            <legend>Keep it as</legend>
            <label class="choice"><input type="radio" name="keep" checked={keepAs === 'fit1'} onChange={() => setKeepAs('fit1')} /> One fitted segment</label>
            <label class="choice"><input type="radio" name="keep" checked={keepAs === 'fit2'} onChange={() => setKeepAs('fit2')} /> Two fitted segments</label>
            <label class="choice"><input type="radio" name="keep" checked={keepAs === 'table'} onChange={() => setKeepAs('table')} /> The table itself (log–log between rows)</label>
          </fieldset>
          {keepAs === 'fit2' && <NumberField id="tableBreakpoint" label={`Breakpoint (${su})`} value={breakpointText} errors={fieldError ? [{ field: fieldError.field, text: fieldError.error }] : []} onInput={setBreakpointText} />}
          {keepAs === 'table' && <NumberField id="tableOffset" label={`Offset (stage of zero flow, ${su})`} hint="blank: the table’s row with discharge 0" value={offsetText} errors={fieldError ? [{ field: fieldError.field, text: fieldError.error }] : []} onInput={setOffsetText} />}
          {result && !('error' in result) && (
            <section class="card" aria-live="polite">
              {result.se !== undefined && <p class="figure"><span data-testid="table-se">{result.se.toFixed(2)} %</span> <small>standard error of the fit to the table</small></p>}
              {result.rating.segments.length <= 3
                ? result.rating.segments.map((s, i, all) => <p key={i} class="formula">{segmentFormula(all, i, u)}</p>)
                : <p>{result.rating.segments.length} pieces, each passing through two neighbouring rows.</p>}
              {result.warnings.map((w, i) => <p key={i} class="callout warn">{w}</p>)}
            </section>
          )}
          <div class="row two">
            <NumberField id="importLow" label={`Lowest gauged (${su})`} hint="optional" value={rangeText[0]} errors={[]} onInput={(v) => setRange([v, rangeText[1]])} />
            <NumberField id="importHigh" label={`Highest gauged (${su})`} hint="optional" value={rangeText[1]} errors={[]} onInput={(v) => setRange([rangeText[0], v])} />
          </div>
          <p class="hint">Stages outside the gauged range are marked extrapolated; the table’s own range is {formatQuantity('stage', table.t.rows[0].stage_m, u)} to {formatQuantity('stage', table.t.rows[table.t.rows.length - 1].stage_m, u)}.</p>
          <button type="button" onClick={() => setRange([toDisplay('stage', table.t.rows[0].stage_m, u).toFixed(u === 'us' ? 2 : 3), toDisplay('stage', table.t.rows[table.t.rows.length - 1].stage_m, u).toFixed(u === 'us' ? 2 : 3)])}>Use the table’s range</button>
          <Field id="importValidFrom" label={`Applies from (${site.timeZone})`}>
            <input id="importValidFrom" type="datetime-local" value={validFromText} onInput={(e) => setValidFromText(e.currentTarget.value)} />
          </Field>
        </>
      )}
      {failure && <p class="callout bad" role="alert">{failure}</p>}
      <button type="button" class="primary wide" disabled={!result || 'error' in result} onClick={() => void save()}>Save rating</button>
    </>
  );
}
