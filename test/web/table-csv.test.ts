import { describe, expect, it } from 'vitest';
import { dischargeAt, M3S_PER_CFS, M_PER_FT, ratingTablesToCsv, type RatingRecord } from '../../core';
import { parseTableCsv, TableCsvError } from '../../web/screens/Ratings/table-csv';

describe('parseTableCsv', () => {
  it('reads a headed table in the units the header names (NIST SP 811 factors, exact)', () => {
    const t = parseTableCsv('Gauge height (ft),Discharge (cfs)\r\n1.00,0\r\n1.50,12.5\r\n2.00,40\r\n', 'metric');
    expect(t.stageUnit).toBe('ft');
    expect(t.dischargeUnit).toBe('ft³/s');
    expect(t.rows[1]).toEqual({ stage_m: 1.5 * M_PER_FT, discharge_m3s: 12.5 * M3S_PER_CFS });
  });
  it('reads a bare table in the site units, a semicolon file with decimal commas, and columns found by name', () => {
    expect(parseTableCsv('0.1,0\n0.2,0.5\n0.3,1.4\n', 'metric').rows[2]).toEqual({ stage_m: 0.3, discharge_m3s: 1.4 });
    expect(parseTableCsv('0,1;0\n0,2;0,5\n0,3;1,4\n', 'metric').rows[1]).toEqual({ stage_m: 0.2, discharge_m3s: 0.5 });
    expect(parseTableCsv('flow m3/s,stage m,note\n0,0.1,dry\n0.5,0.2,\n1.4,0.3,\n', 'us').rows[2]).toEqual({ stage_m: 0.3, discharge_m3s: 1.4 });
  });
  it('refuses missing cells, text in number cells and unordered rows, naming the line', () => {
    const fail = (text: string) => {
      try {
        parseTableCsv(text, 'metric');
      } catch (e) {
        expect(e).toBeInstanceOf(TableCsvError);
        return (e as Error).message;
      }
      throw new Error('accepted');
    };
    expect(fail('stage,discharge\n0.1,0\n0.2,\n0.3,1')).toMatch(/^Line 3: a stage and a discharge are needed/);
    expect(fail('stage,discharge\n0.1,0\n0.2,lots\n0.3,1')).toMatch(/^Line 3: the discharge “lots” is not a number/);
    expect(fail('0.1,0\n0.3,1\n0.2,2')).toMatch(/^Line 3: the stage 0.2 is not above/);
    expect(fail('stage,discharge\n0.1,0\n0.2,1')).toMatch(/at least 3 lines/);
    expect(fail('')).toMatch(/^Line 1: the file is empty/);
  });
  // The screen's CSV is core's one table writer; what it writes, the import reads back (round trip, exact
  // to the printed digits: Q = 5·(h − 0.1)² by hand at the printed stages).
  it('reads back the table the screen writes', () => {
    const rating = {
      id: 'r', siteId: 's', validFrom_ms: Date.UTC(2026, 0, 1), shifts: [], note: '', rev: '', updated_ms: 0,
      segments: [{ fromStage_m: 0.1, offset_m: 0.1, coefficient: 5, exponent: 2 }], gaugedRange_m: [0.2, 0.3],
    } as unknown as RatingRecord;
    const csv = ratingTablesToCsv([rating], { units: 'metric', timeZone: 'UTC', siteCode: 'X-1', from_m: 0.1, top_m: 0.4, step: 0.1 });
    const t = parseTableCsv(csv, 'metric');
    expect(t.rows.map((r) => r.stage_m)).toEqual([0.1, 0.2, 0.3, 0.4]);
    t.rows.forEach((r) => expect(r.discharge_m3s).toBeCloseTo(dischargeAt(rating, r.stage_m), 6));
  });
});
