// Every separation method on one storm, side by side: the direct runoff volume and depth of each, or the
// plain reason it cannot run here, and the spread from the lowest to the highest.
import type { EventPoints } from '../../../core';
import { METHOD_KINDS, type MethodKind } from '../../components/SeparationPicker';
import { analyse, type StormSeries } from './analysis';
import { defaultMethodChoice, methodFor, type MethodChoice } from './method-choice';

/** One method's figures on the storm (m³, mm), or the sentence saying why it gave none. */
export interface MethodOutcome {
  kind: MethodKind;
  volume_m3?: number;
  depth_mm?: number;
  problem?: string;
  /** Why the volume stays out of the range's spread (it is still shown in the table). */
  leftOut?: string;
}

/** The lowest and highest direct runoff volumes among the methods that worked (m³), with their methods. */
export interface MethodSpread {
  low_m3: number;
  high_m3: number;
  lowKind: MethodKind;
  highKind: MethodKind;
  count: number;
}

/**
 * Every method on the storm with the same key points and window; Eckhardt with the constants the user
 * typed (the defaults while they cannot be read), the others with their defaults.
 */
export function everyMethod(
  series: StormSeries,
  points: EventPoints,
  area_km2: number | undefined,
  choice: MethodChoice,
): MethodOutcome[] {
  return METHOD_KINDS.map((kind) => {
    let made = methodFor({ ...choice, kind }, area_km2);
    if ('problem' in made && kind === 'eckhardt') made = methodFor({ ...defaultMethodChoice, kind }, area_km2);
    if ('problem' in made) return { kind, problem: made.problem };
    const r = analyse(series, points, made.method, area_km2, undefined);
    if (!r.ok) return { kind, problem: r.message };
    const out: MethodOutcome = { kind, volume_m3: r.value.summary.directVolume_m3 };
    if (r.value.summary.runoffDepth_mm !== undefined) out.depth_mm = r.value.summary.runoffDepth_mm;
    if (r.value.leftOut !== undefined) out.leftOut = r.value.leftOut;
    return out;
  });
}

/** The spread of the methods suited to the record that gave a volume; undefined when none did. */
export function methodSpread(rows: readonly MethodOutcome[]): MethodSpread | undefined {
  let spread: MethodSpread | undefined;
  for (const r of rows) {
    if (r.volume_m3 === undefined || r.leftOut !== undefined) continue;
    if (!spread) spread = { low_m3: r.volume_m3, high_m3: r.volume_m3, lowKind: r.kind, highKind: r.kind, count: 0 };
    if (r.volume_m3 < spread.low_m3) Object.assign(spread, { low_m3: r.volume_m3, lowKind: r.kind });
    if (r.volume_m3 > spread.high_m3) Object.assign(spread, { high_m3: r.volume_m3, highKind: r.kind });
    spread.count++;
  }
  return spread;
}
