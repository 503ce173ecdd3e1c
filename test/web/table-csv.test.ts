import { describe, expect, it } from 'vitest';
import { M3S_PER_CFS, M_PER_FT, ratingTable } from '../../core';
import { parseTableCsv, ratingTableCsv, TableCsvError } from '../../web/screens/Ratings/table-csv';

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
  it('writes the rating table with the extrapolated rows marked (RFC 4180, CRLF)', () => {
    const rows = ratingTable({ segments: [{ fromStage_m: 0.1, offset_m: 0.1, coefficient: 5, exponent: 2 }], gaugedRange_m: [0.2, 0.3] }, 0.1, 0.4, 0.1);
    expect(ratingTableCsv(rows, 'metric')).toBe('stage (m),discharge (m3/s),extrapolated\r\n0.100,0,yes\r\n0.200,0.05,no\r\n0.300,0.2,no\r\n0.400,0.45,yes\r\n');
  });
});
