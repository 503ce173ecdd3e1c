// The verticals of velocity–area gaugings as a CSV table, one row per vertical beside the gaugings table:
// the gauging's id, station, depth, the point and mean velocities, angle coefficient, and the width,
// area, discharge and share of the subsection each vertical stands for (mid-section method, ISO 748).
import { midSection } from '../gauging/mid-section';
import type { GaugingRecord } from '../records/index';
import { displayUnit, M_PER_FT, toDisplay } from '../units';
import { csvNumber, csvTable, type CsvColumn } from './csv-write';
import type { SiteCsvOptions } from './gaugings-csv';

/**
 * The verticals of the gaugings given (in their order; gaugings without verticals are left out) as a
 * CSV document: lengths and velocities in `units`, area in m² or ft², discharge in m³/s or ft³/s,
 * share in percent of the gauging's discharge. Point velocities are empty where they were not typed.
 */
export function gaugingVerticalsToCsv(gaugings: readonly GaugingRecord[], options: SiteCsvOptions): string {
  const { units, siteCode } = options;
  const l = displayUnit('length', units);
  const v = displayUnit('velocity', units);
  const q = displayUnit('discharge', units);
  const a = units === 'us' ? 'ft²' : 'm²';
  const columns: CsvColumn[] = [
    { name: 'gauging_id', kind: 'text' }, { name: 'site', kind: 'text' }, { name: 'vertical', kind: 'number' },
    { name: `station_${l}`, kind: 'number' }, { name: `depth_${l}`, kind: 'number' },
    { name: `velocity_0.2_${v}`, kind: 'number' }, { name: `velocity_0.6_${v}`, kind: 'number' }, { name: `velocity_0.8_${v}`, kind: 'number' },
    { name: `mean_velocity_${v}`, kind: 'number' }, { name: 'angle_coefficient', kind: 'number' },
    { name: `width_${l}`, kind: 'number' }, { name: `area_${a}`, kind: 'number' }, { name: `discharge_${q}`, kind: 'number' },
    { name: 'share_percent', kind: 'number' },
  ];
  const len = (x_m: number) => csvNumber(toDisplay('length', x_m, units), 6);
  const vel = (x_mps: number | undefined) => (x_mps === undefined ? '' : csvNumber(toDisplay('velocity', x_mps, units), 6));
  const area = (x_m2: number) => csvNumber(units === 'us' ? x_m2 / (M_PER_FT * M_PER_FT) : x_m2, 6);
  const rows: string[][] = [];
  for (const g of gaugings) {
    if (!g.verticals || g.verticals.length < 2) continue;
    const result = midSection(g.verticals);
    g.verticals.forEach((vert, i) => {
      const s = result.subsections[i];
      const o = vert.observed;
      rows.push([
        g.id, siteCode, String(i + 1), len(vert.station_m), len(vert.depth_m),
        vel(o && o.kind !== 'six-tenths' ? o.v02_mps : undefined),
        vel(o && o.kind !== 'two-point' ? o.v06_mps : undefined),
        vel(o && o.kind !== 'six-tenths' ? o.v08_mps : undefined),
        vel(vert.velocity_mps), csvNumber(vert.angleCoefficient ?? 1, 6),
        len(s.width_m), area(s.area_m2), csvNumber(toDisplay('discharge', s.discharge_m3s, units), 6), csvNumber(100 * s.share, 4),
      ]);
    });
  }
  return csvTable(columns, rows);
}
