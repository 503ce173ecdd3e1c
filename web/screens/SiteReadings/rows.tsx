// Rows of a site's readings list: a spot reading (open for its notes, edit and delete) and a logger day
// collapsed to one row (open for its range, drift corrections and the file it came from).
import type { ReadingWithDischarge, SiteRecord } from '../../../core';
import { hasDischarge } from '../../../core';
import { formatAgo, formatQuantity, formatTime } from '../../format';
import { href } from '../../router';
import type { LoggerDayItem } from './list-items';

/** One spot reading: stage, discharge, flags; opened, its notes and the edit and delete buttons. */
export function ReadingRow({ r, site, now, onDelete }: { r: ReadingWithDischarge; site: SiteRecord; now: number; onDelete: (r: ReadingWithDischarge) => void }) {
  const u = site.displayUnits;
  return (
    <li class="reading-row">
      <details>
        <summary class="item">
          <span>
            <strong>{formatQuantity('stage', r.reading.stage_m, u)}</strong>
            <span class="hint">
              {!hasDischarge(r.discharge_m3s) ? 'no rating' : formatQuantity('discharge', r.discharge_m3s, u)}
              {r.extrapolated && <> <span class="tag">extrapolated</span></>}
              {r.reading.warnings.length > 0 && <> <span class="tag">{r.reading.warnings.length} warning{r.reading.warnings.length > 1 ? 's' : ''}</span></>}
              {r.reading.loggerCheck && <> <span class="tag" data-testid="check-tag">check: logger − gauge {formatQuantity('stage', r.reading.loggerCheck.logger_m - r.reading.stage_m, u)}</span></>}
            </span>
          </span>
          <span>
            <span>{formatTime(r.reading.time_ms, site.timeZone)}</span>
            <span class="hint">{r.reading.source} · {formatAgo(r.reading.time_ms, now)}</span>
          </span>
        </summary>
        <div class="reading-more">
          {r.reading.warnings.length > 0 && <ul>{r.reading.warnings.map((w, i) => <li key={i}>{w}</li>)}</ul>}
          {r.reading.note && <p>Note: {r.reading.note}</p>}
          <p class="hint">
            {r.reading.quality} quality{r.reading.observer && ` · read by ${r.reading.observer}`}
            {r.shift_m !== 0 && ` · shift ${formatQuantity('stage', r.shift_m, u)}`}
            {r.reading.gps && ` · location ± ${Math.round(r.reading.gps.accuracy_m)} m`}
          </p>
          <div class="row reading-actions">
            <a class="button" href={href('record', site.id, r.reading.id)} aria-label={`Edit the reading at ${formatTime(r.reading.time_ms, site.timeZone)}`}>Edit</a>
            <button type="button" class="danger" onClick={() => onDelete(r)} aria-label={`Delete the reading at ${formatTime(r.reading.time_ms, site.timeZone)}`}>Delete</button>
          </div>
        </div>
      </details>
    </li>
  );
}

/** A stage range as text: one value, or "low to high". */
function range(a: number, b: number, site: SiteRecord): string {
  const lo = formatQuantity('stage', a, site.displayUnits);
  const hi = formatQuantity('stage', b, site.displayUnits);
  return lo === hi ? lo : `${lo} to ${hi}`;
}

/** One logger day collapsed: how many values and their range; opened, the corrections and the file. */
export function LoggerDayRow({ day, site }: { day: LoggerDayItem; site: SiteRecord }) {
  const u = site.displayUnits;
  return (
    <li class="reading-row" data-testid="logger-day">
      <details>
        <summary class="item">
          <span>
            <strong>{range(day.minStage_m, day.maxStage_m, site)}</strong>
            <span class="hint">
              {day.count} logger value{day.count === 1 ? '' : 's'}
              {hasDischarge(day.maxDischarge_m3s) && ` · up to ${formatQuantity('discharge', day.maxDischarge_m3s, u)}`}
              {day.extrapolated > 0 && <> <span class="tag">{day.extrapolated} extrapolated</span></>}
            </span>
          </span>
          <span>
            <span>{formatTime(day.first_ms, site.timeZone)}</span>
            <span class="hint">logger · to {formatTime(day.last_ms, site.timeZone)}</span>
          </span>
        </summary>
        <div class="reading-more">
          <p>Drift correction {range(day.minCorrection_m, day.maxCorrection_m, site)} (stage shown = logger value + correction){day.checks > 0 ? `, from ${day.checks} check reading${day.checks === 1 ? '' : 's'}` : ', no check readings'}.</p>
          <p class="hint">From the file {day.fileName}{day.note && ` · ${day.note}`}</p>
        </div>
      </details>
    </li>
  );
}
