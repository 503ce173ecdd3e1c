// The mapping step of a logger import: which line the data start on, the time and level columns, the
// time format, the clock of the stamps (asked, never guessed) and the level's unit, with the first rows
// shown as they will be stored (stacked, so the stored time and stage fit a 360 px screen).
import { useMemo } from 'preact/hooks';
import {
  displayUnit, LOGGER_LEVEL_UNITS, LOGGER_TIME_FORMATS, loggerReader, toDisplay, toIsoWithOffset, utcOfCivil, zoneOffset_min,
  type LoggerClock, type LoggerLevelUnit, type LoggerMapping, type LoggerTimeFormat, type SiteRecord,
} from '../../../core';
import { Field } from '../../components/Field';
import type { MappingWithoutClock } from '../../logger/guess-mapping';
import { plainError } from '../../plain-words';

/** The clock choices offered; '' until the user picks one. */
export type ClockChoice = '' | 'utc' | 'standard' | 'zone' | 'in-stamp';

/** The mapping being edited: everything but the clock, the clock choice and the standard-time offset. */
export interface MappingDraft {
  base: MappingWithoutClock;
  clock: ClockChoice;
  /** Minutes east of UTC for 'standard'. */
  standardOffset_min: number;
  /** True while the dates read both day-first and month-first and the user has not said which. */
  askDateOrder?: boolean;
}

const FORMAT_LABELS: Record<LoggerTimeFormat, string> = {
  'year-month-day': 'year-month-day (2026-03-01 14:15)',
  'day-month-year': 'day/month/year (01/03/2026 14:15)',
  'month-day-year': 'month/day/year (03/01/2026 14:15)',
};
const UNIT_LABELS: Record<LoggerLevelUnit, string> = { m: 'metres', cm: 'centimetres', ft: 'feet', kPa: 'kPa (pressure head of fresh water)' };

/** "+12:00" for 720 minutes east. */
export function offsetLabel(offset_min: number): string {
  const a = Math.abs(offset_min);
  return `${offset_min < 0 ? '−' : '+'}${String(Math.floor(a / 60)).padStart(2, '0')}:${String(a % 60).padStart(2, '0')}`;
}

/** The site zone's standard offset (the smaller of its January and July offsets), minutes east. */
export function standardOffsetOf(timeZone: string, year: number): number {
  return Math.min(zoneOffset_min(utcOfCivil(year, 1, 1), timeZone), zoneOffset_min(utcOfCivil(year, 7, 1), timeZone));
}

/** The full mapping, or undefined while the clock is not chosen. */
export function mappingOf(d: MappingDraft, site: SiteRecord): LoggerMapping | undefined {
  const clock: LoggerClock | undefined =
    d.clock === 'utc' ? { kind: 'fixed-offset', offset_min: 0 }
      : d.clock === 'standard' ? { kind: 'fixed-offset', offset_min: d.standardOffset_min }
        : d.clock === 'zone' ? { kind: 'zone', timeZone: site.timeZone }
          : d.clock === 'in-stamp' ? { kind: 'in-stamp' } : undefined;
  return clock && !d.askDateOrder ? { ...d.base, clock } : undefined;
}

const OFFSETS = Array.from({ length: (14 + 12) * 4 + 1 }, (_, i) => -12 * 60 + i * 15);

function columnOptions(n: number) {
  return Array.from({ length: n }, (_, i) => <option key={i} value={i + 1}>{`field ${i + 1}`}</option>);
}

/** The mapping form and the preview of the first rows as stored. */
export function MappingStep({ site, rows, draft, onChange }: {
  site: SiteRecord;
  rows: string[][];
  draft: MappingDraft;
  onChange: (next: MappingDraft) => void;
}) {
  const b = draft.base;
  const set = (patch: Partial<MappingWithoutClock>) => onChange({ ...draft, base: { ...b, ...patch } });
  const fields = Math.max(2, ...rows.map((r) => r.length));
  const mapping = mappingOf(draft, site);
  const u = site.displayUnits;
  const preview = useMemo(() => {
    if (!mapping) return undefined;
    try {
      const reader = loggerReader(mapping, { problemLimit: 50 });
      rows.forEach((cells, i) => reader.push(cells, i + 1));
      const read = reader.finish(true);
      const byLine = new Map<number, { time: string; stage: string } | { problem: string }>();
      for (let i = 0; i < read.line.length; i++) {
        byLine.set(read.line[i], {
          time: toIsoWithOffset(read.time_ms[i], site.timeZone),
          stage: toDisplay('stage', read.level_m[i], u).toFixed(u === 'us' ? 3 : 4),
        });
      }
      for (const p of read.problems) byLine.set(p.line, { problem: p.message });
      return { byLine };
    } catch (err) {
      return { error: plainError(err) };
    }
  }, [rows, mapping && JSON.stringify(mapping), site.timeZone, u]);

  return (
    <section class="card" aria-labelledby="mapping-heading">
      <h3 id="mapping-heading">How to read the file</h3>
      <div class="row two">
        <Field id="first-line" label="Data start on line">
          <input id="first-line" type="number" min={1} inputMode="numeric" value={b.firstDataLine}
            onInput={(e) => set({ firstDataLine: Math.max(1, Math.floor(Number(e.currentTarget.value) || 1)) })} />
        </Field>
        <Field id="separator" label="Fields separated by">
          <select id="separator" value={b.delimiter} onChange={(e) => {
            const delimiter = e.currentTarget.value as MappingWithoutClock['delimiter'];
            set({ delimiter, decimalMark: delimiter === ',' ? '.' : b.decimalMark });
          }}>
            <option value=",">comma</option>
            <option value=";">semicolon</option>
            <option value={'\t'}>tab</option>
          </select>
        </Field>
      </div>
      <div class="row two">
        <Field id="date-column" label="Date column">
          <select id="date-column" value={b.dateColumn ?? 0} onChange={(e) => {
            const v = Number(e.currentTarget.value);
            const { dateColumn: _d, ...rest } = b;
            onChange({ ...draft, base: v === 0 ? rest : { ...rest, dateColumn: v } });
          }}>
            <option value={0}>in the time column</option>
            {columnOptions(fields)}
          </select>
        </Field>
        <Field id="time-column" label="Time column">
          <select id="time-column" value={b.timeColumn} onChange={(e) => set({ timeColumn: Number(e.currentTarget.value) })}>{columnOptions(fields)}</select>
        </Field>
      </div>
      <Field id="time-format" label="Time written as">
        <select id="time-format" value={draft.askDateOrder ? '' : b.timeFormat} aria-invalid={draft.askDateOrder ? true : undefined}
          onChange={(e) => onChange({ ...draft, askDateOrder: false, base: { ...b, timeFormat: e.currentTarget.value as LoggerTimeFormat } })}>
          {draft.askDateOrder && <option value="">Choose… (the dates read both ways)</option>}
          {LOGGER_TIME_FORMATS.map((f) => <option key={f} value={f}>{FORMAT_LABELS[f]}</option>)}
        </select>
      </Field>
      {draft.askDateOrder && (
        <p class="callout warn" role="status" data-testid="date-order">
          Every date in the first lines reads both day-first and month-first (e.g. 03/04 is 3 April or 4 March). Choose how the logger writes dates.
        </p>
      )}
      <Field id="clock" label="Clock of the logger's times" hint="Loggers often keep local standard time all year. Check the logger's settings: this is never guessed.">
        <select id="clock" value={draft.clock} aria-describedby="clock-hint" aria-invalid={draft.clock === '' ? true : undefined}
          onChange={(e) => onChange({ ...draft, clock: e.currentTarget.value as ClockChoice })}>
          <option value="">Choose…</option>
          <option value="utc">UTC</option>
          <option value="standard">Local standard time all year, no daylight saving</option>
          <option value="zone">Local clock time with daylight saving ({site.timeZone})</option>
          <option value="in-stamp">Each time carries its own UTC offset</option>
        </select>
      </Field>
      {draft.clock === 'standard' && (
        <Field id="standard-offset" label="Standard time offset from UTC">
          <select id="standard-offset" value={draft.standardOffset_min} onChange={(e) => onChange({ ...draft, standardOffset_min: Number(e.currentTarget.value) })}>
            {OFFSETS.map((o) => <option key={o} value={o}>UTC{offsetLabel(o)}</option>)}
          </select>
        </Field>
      )}
      <div class="row two">
        <Field id="level-column" label="Level column">
          <select id="level-column" value={b.levelColumn} onChange={(e) => set({ levelColumn: Number(e.currentTarget.value) })}>{columnOptions(fields)}</select>
        </Field>
        <Field id="level-unit" label="Level unit">
          <select id="level-unit" value={b.levelUnit} onChange={(e) => set({ levelUnit: e.currentTarget.value as LoggerLevelUnit })}>
            {LOGGER_LEVEL_UNITS.map((x) => <option key={x} value={x}>{UNIT_LABELS[x]}</option>)}
          </select>
        </Field>
      </div>
      <div class="row two">
        {b.delimiter !== ',' && (
          <Field id="decimal" label="Decimal mark">
            <select id="decimal" value={b.decimalMark} onChange={(e) => set({ decimalMark: e.currentTarget.value as '.' | ',' })}>
              <option value=".">point (0.734)</option>
              <option value=",">comma (0,734)</option>
            </select>
          </Field>
        )}
        <Field id="datum-offset" label="Add to every level (m)" hint="e.g. the sensor's height above the gauge datum">
          <input id="datum-offset" type="text" inputMode="decimal" value={String(b.datumOffset_m)} aria-describedby="datum-offset-hint"
            onChange={(e) => {
              const v = Number(e.currentTarget.value.replace(',', '.'));
              set({ datumOffset_m: Number.isFinite(v) ? v : 0 });
            }} />
        </Field>
      </div>
      <h4>The first lines as they will be stored</h4>
      {!mapping && <p class="callout warn" role="status">{draft.askDateOrder ? 'Choose how the dates are written' : 'Choose the clock of the logger\'s times'} to see the rows as they will be stored.</p>}
      {preview && 'error' in preview && <p class="callout bad" role="alert">{preview.error}</p>}
      <ol class="preview" aria-label="First lines of the file">
        {rows.slice(0, 15).map((cells, i) => {
          const line = i + 1;
          const row = preview && 'byLine' in preview ? preview.byLine?.get(line) : undefined;
          return (
            <li key={line} class={line < b.firstDataLine ? 'muted' : undefined} data-line={line}>
              <span class="line">Line {line}</span>
              <span class="cells">{cells.join(' | ')}</span>
              {row && 'problem' in row ? <span class="problem">{row.problem}</span> : line < b.firstDataLine ? <span class="hint">header</span> : row && (
                <span class="stored">
                  <span class="time" data-testid="stored-time">{row.time}</span>
                  <span class="stage" data-testid="stored-stage">{row.stage} {displayUnit('stage', u)}</span>
                </span>
              )}
            </li>
          );
        })}
      </ol>
    </section>
  );
}
