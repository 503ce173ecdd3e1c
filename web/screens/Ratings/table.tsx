// The rating table at a step of the user's choice, extrapolated rows marked; shared or saved as CSV.
import { useMemo, useState } from 'preact/hooks';
import { fromDisplay, ratingTable, ratingTablesToCsv, toDisplay, type RatingRecord, type SiteRecord } from '../../../core';
import { Field } from '../../components/Field';
import { formatQuantity, parseDecimal } from '../../format';
import { downloadFile } from '../../save-file';

/** The table of one rating, from its zero-flow stage (or gauged low) to above its gauged top. */
export function RatingTableView({ site, rating }: { site: SiteRecord; rating: RatingRecord }) {
  const u = site.displayUnits;
  const su = u === 'us' ? 'ft' : 'm';
  const first = rating.segments[0];
  const last = rating.segments[rating.segments.length - 1];
  const lowDefault = rating.gaugedRange_m ? Math.min(rating.gaugedRange_m[0], Math.max(first.offset_m, rating.gaugedRange_m[0] - 0.2)) : first.offset_m;
  const highDefault = rating.gaugedRange_m ? rating.gaugedRange_m[1] + 0.2 * (rating.gaugedRange_m[1] - rating.gaugedRange_m[0]) : Math.max(last.fromStage_m, first.offset_m) + 1;
  const fmt = (m: number) => toDisplay('stage', m, u).toFixed(u === 'us' ? 2 : 2);
  const [stepText, setStepText] = useState(u === 'us' ? '0.05' : '0.01');
  const [fromText, setFromText] = useState(fmt(lowDefault));
  const [toText, setToText] = useState(fmt(highDefault));
  const [message, setMessage] = useState<string>();
  const table = useMemo((): { rows: ReturnType<typeof ratingTable>; from_m: number; to_m: number; step: number } | { error: string } => {
    const step = parseDecimal(stepText);
    const from = parseDecimal(fromText);
    const to = parseDecimal(toText);
    if (step === undefined || !(step > 0)) return { error: `The step must be a number above 0 in ${su}, like 0.01.` };
    if (from === undefined || to === undefined) return { error: `The table needs a first and last stage as numbers in ${su}.` };
    if (!(to >= from)) return { error: 'The last stage must not be below the first.' };
    if ((to - from) / step > 2000) return { error: 'That would be more than 2,000 rows; use a larger step or a shorter range.' };
    const from_m = fromDisplay('stage', from, u);
    const to_m = fromDisplay('stage', to, u);
    return { rows: ratingTable(rating, from_m, to_m, fromDisplay('stage', step, u)), from_m, to_m, step };
  }, [stepText, fromText, toText, rating, u, su]);
  const csvName = `${site.code.replace(/[^\w.-]+/g, '_')}-rating-table.csv`;

  async function share() {
    if (!('rows' in table)) return;
    const csv = ratingTablesToCsv([rating], { units: u, timeZone: site.timeZone, siteCode: site.code, from_m: table.from_m, top_m: table.to_m, step: table.step });
    const file = new File([csv], csvName, { type: 'text/csv;charset=utf-8' });
    try {
      if (navigator.canShare?.({ files: [file] })) {
        await navigator.share({ files: [file], title: `${site.name} rating table` });
        return;
      }
    } catch (err) {
      if ((err as Error).name === 'AbortError') return;
    }
    downloadFile(file);
    setMessage(`Saved as ${csvName}.`);
  }

  return (
    <section aria-labelledby="table-heading">
      <h3 id="table-heading">Rating table</h3>
      <div class="row two">
        <Field id="tableFrom" label={`From (${su})`}><input id="tableFrom" inputMode="decimal" value={fromText} onInput={(e) => setFromText(e.currentTarget.value)} /></Field>
        <Field id="tableTo" label={`To (${su})`}><input id="tableTo" inputMode="decimal" value={toText} onInput={(e) => setToText(e.currentTarget.value)} /></Field>
      </div>
      <Field id="tableStep" label={`Step (${su})`}><input id="tableStep" inputMode="decimal" value={stepText} onInput={(e) => setStepText(e.currentTarget.value)} /></Field>
      {'error' in table ? <p class="callout bad" role="alert">{table.error}</p> : (
        <>
          <button type="button" class="wide" onClick={() => void share()}>Share or save as CSV</button>
          {message && <p class="callout ok" role="status">{message}</p>}
          <div class="table-scroll card" tabIndex={0} aria-label="Rating table rows">
            <table data-testid="rating-table">
              <thead><tr><th scope="col">Stage</th><th scope="col">Discharge</th></tr></thead>
              <tbody>
                {table.rows.map((r) => (
                  <tr key={r.stage_m} data-extrapolated={r.extrapolated ? 'yes' : undefined}>
                    <td>{formatQuantity('stage', r.stage_m, u)}</td>
                    <td>{formatQuantity('discharge', r.discharge_m3s, u)}{r.extrapolated && <span class="tag extrapolated-row">extrapolated</span>}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
    </section>
  );
}
