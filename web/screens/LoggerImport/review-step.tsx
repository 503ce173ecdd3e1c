// The review step of a logger import: what reading the file found (lines that could not be read,
// repeated times, clock changes, holes), the drift correction table from the check readings in the
// period, and a small plot of the raw and corrected record with the checks, before anything is stored.
import { useMemo } from 'preact/hooks';
import {
  clockChanges, displayUnit, driftCorrections, driftTable, loggerGaps, toDisplay, toIsoWithOffset,
  type DriftCheck, type LoggerMapping, type SiteRecord,
} from '../../../core';
import { Plot, type PlotDrawView } from '../../components/Plot';
import { formatQuantity, formatTime } from '../../format';
import type { LoggerFileRead } from '../../logger/read-logger';
import { offsetLabel } from './mapping-step';

/** A possible check in the period: the gauge reading, the logger's value, where that came from, and whether it is used. */
export interface CheckChoice extends DriftCheck {
  /** 'typed' when the reading was marked as a check with the logger's value; 'file' when read from this file. */
  loggerFrom: 'typed' | 'file';
  use: boolean;
}

const MAX_PLOT_POINTS = 1500;

function minutes(ms: number): string {
  const m = Math.round(ms / 60_000);
  return m < 120 ? `${m} min` : `${Math.floor(m / 60)} h ${m % 60} min`;
}

/** Plain sentences about the times: repeated hours, backward steps, holes, and the site's clock changes. */
function timeNotes(read: LoggerFileRead, mapping: LoggerMapping, site: SiteRecord): string[] {
  const notes: string[] = [];
  const { time_ms, line } = read.series;
  for (const r of read.rows.repeatedHour) {
    notes.push(`Lines ${r.fromLine}–${r.toLine} fall in the hour repeated when the clocks went back; they were read as the second pass, after the change.`);
  }
  for (const s of read.rows.backwardSteps.slice(0, 5)) {
    notes.push(`At line ${s.line} the times go back ${minutes(s.back_ms)} from the line before: if this is at a clock change, the logger may keep daylight saving time.`);
  }
  for (const g of loggerGaps(time_ms, line, 5)) {
    notes.push(`No values for ${minutes(g.to_ms - g.from_ms)} between line ${g.afterLine} (${formatTime(g.from_ms, site.timeZone)}) and line ${g.beforeLine}.`);
  }
  if (time_ms.length > 1) {
    const changes = clockChanges(site.timeZone, time_ms[0], time_ms[time_ms.length - 1]);
    if (changes.length > 0 && mapping.clock.kind !== 'zone') {
      const how = mapping.clock.kind === 'fixed-offset'
        ? `the times are read as fixed UTC${offsetLabel(mapping.clock.offset_min)}, so no hour is skipped or repeated there`
        : 'each time carries its own offset';
      const first = formatTime(changes[0].at_ms, site.timeZone);
      notes.push(changes.length === 1
        ? `The site's clocks changed at ${first}: ${how}.`
        : `The site's clocks changed ${changes.length} times in this period (first at ${first}): ${how}.`);
    }
    if (mapping.clock.kind === 'zone') {
      for (const c of changes) {
        const when = formatTime(c.at_ms, site.timeZone);
        notes.push(c.after_min < c.before_min
          ? `The site's clocks went back at ${when}: the repeated hour was read in file order.`
          : `The site's clocks went forward at ${when}: the skipped hour has no times, as expected.`);
      }
    }
  }
  return notes;
}

/** Findings, corrections and the plot; the apply controls are the screen's. */
export function ReviewStep({ site, read, mapping, checks, onToggle }: {
  site: SiteRecord;
  read: LoggerFileRead;
  mapping: LoggerMapping;
  checks: CheckChoice[];
  onToggle: (index: number, use: boolean) => void;
}) {
  const u = site.displayUnits;
  const { series, rows } = read;
  const n = series.time_ms.length;
  const used = useMemo(() => checks.filter((c) => c.use), [checks]);
  const table = useMemo(() => driftTable(used), [used]);
  const corrections = useMemo(() => driftCorrections(used, series.time_ms), [used, series]);
  const notes = useMemo(() => timeNotes(read, mapping, site), [read, mapping, site.timeZone]);
  const plot = useMemo(() => {
    const step = Math.max(1, Math.ceil(n / MAX_PLOT_POINTS));
    const m = Math.ceil(n / step);
    const x = new Float64Array(m);
    const raw = new Float64Array(m);
    const corrected = new Float64Array(m);
    for (let k = 0, i = 0; i < n; i += step, k++) {
      x[k] = series.time_ms[i];
      raw[k] = toDisplay('stage', series.level_m[i], u);
      corrected[k] = toDisplay('stage', series.level_m[i] + corrections[i], u);
    }
    return { x, raw, corrected };
  }, [series, corrections, u]);
  const drawChecks = (v: PlotDrawView) => {
    v.ctx.fillStyle = v.colour('--warn-line', '#b35c00');
    for (const c of used) {
      v.ctx.beginPath();
      v.ctx.arc(v.xPos(c.time_ms), v.yPos(toDisplay('stage', c.staff_m, u)), 5 * v.ratio, 0, 2 * Math.PI);
      v.ctx.fill();
    }
  };
  const unit = displayUnit('stage', u);
  const corrAt = (i: number) => formatQuantity('stage', corrections[i], u);

  return (
    <>
      <section class="card" aria-labelledby="found-heading">
        <h3 id="found-heading">What the file holds</h3>
        <dl class="facts">
          <dt>Values read</dt>
          <dd data-testid="values-read">{n.toLocaleString('en-GB')}</dd>
          {n > 0 && (
            <>
              <dt>From</dt>
              <dd>{toIsoWithOffset(series.time_ms[0], site.timeZone)}</dd>
              <dt>To</dt>
              <dd>{toIsoWithOffset(series.time_ms[n - 1], site.timeZone)}</dd>
            </>
          )}
          <dt>Lines not read</dt>
          <dd data-testid="problem-count">{rows.problemCount}</dd>
          <dt>Repeated times left out</dt>
          <dd>{series.duplicates.length}</dd>
        </dl>
        {rows.problems.length > 0 && (
          <ul class="problems" aria-label="Lines that could not be read">
            {rows.problems.slice(0, 20).map((p) => <li key={`${p.line}-${p.column ?? 0}`}>{p.message}</li>)}
            {rows.problemCount > 20 && <li>…and {rows.problemCount - 20} more.</li>}
          </ul>
        )}
        {series.duplicates.length > 0 && (
          <p class="callout warn">
            {series.duplicates.length} line{series.duplicates.length === 1 ? ' repeats' : 's repeat'} the time of an earlier line and {series.duplicates.length === 1 ? 'is' : 'are'} left out
            (first: line {series.duplicates[0].line} repeats line {series.duplicates[0].firstLine}).
          </p>
        )}
        {notes.map((t) => <p key={t} class="callout" data-testid="time-note">{t}</p>)}
      </section>
      <section class="card" aria-labelledby="drift-heading">
        <h3 id="drift-heading">Drift correction</h3>
        <p class="hint">At each check the correction is the gauge reading minus the logger’s value; between checks it changes in proportion to time; before the first and after the last it stays. The raw values are kept.</p>
        {checks.length === 0 && <p class="callout warn" data-testid="no-checks">No check readings at this site in the file’s period: the values are stored uncorrected.</p>}
        {checks.length > 0 && (
          <div class="scroll-x" tabIndex={0} role="region" aria-label="Corrections table, scrolls sideways">
            <table class="corrections" aria-label="Drift corrections at the checks">
              <thead>
                <tr><th scope="col">Use</th><th scope="col">Time</th><th scope="col">Gauge ({unit})</th><th scope="col">Logger ({unit})</th><th scope="col">Correction ({unit})</th></tr>
              </thead>
              <tbody>
                {checks.map((c, i) => (
                  <tr key={c.time_ms} data-testid="check-row">
                    <td><input type="checkbox" checked={c.use} aria-label={`Use the check at ${formatTime(c.time_ms, site.timeZone)}`} onChange={(e) => onToggle(i, e.currentTarget.checked)} /></td>
                    <td>{formatTime(c.time_ms, site.timeZone)}</td>
                    <td>{toDisplay('stage', c.staff_m, u).toFixed(3)}</td>
                    <td>{toDisplay('stage', c.logger_m, u).toFixed(3)}{c.loggerFrom === 'file' && <span class="hint">from the file</span>}</td>
                    <td data-testid="correction">{formatQuantity('stage', c.staff_m - c.logger_m, u)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {n > 0 && table.length > 0 && (
          <p class="muted" data-testid="correction-span">Correction at the first value {corrAt(0)}, at the last {corrAt(n - 1)}.</p>
        )}
        {n > 1 && (
          <Plot
            x={plot.x}
            xAxis={{ kind: 'time', timeZone: site.timeZone }}
            series={[
              { label: 'Raw', values: plot.raw, colour: '--muted', width: 1 },
              { label: 'Corrected', values: plot.corrected, colour: '--accent', width: 2 },
            ]}
            yLabel={`Stage (${unit})`}
            height={180}
            zoom={false}
            draw={drawChecks}
            description={`The logger record raw and corrected, ${n} values, with ${used.length} check${used.length === 1 ? '' : 's'} shown as dots.`}
          />
        )}
      </section>
    </>
  );
}
