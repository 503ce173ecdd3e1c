// WaterML 2.0 exports: every document is validated against the OGC schemas by the offline kit
// (test/fixtures/waterml2, carried in the repository; xmllint; WaterML 2.0 Part 1 OGC 10-126r4, Part 2 OGC 15-018r2),
// and read back with fast-xml-parser (a general-purpose XML parser, test-only oracle) to check the values.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLParser } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import {
  NO_DISCHARGE, demoScenario, dischargeAt, isExtrapolated, stageExportRows, stageRecordWithDischarge, ratingConversionPoints, toIsoWithOffset, watermlRatings, watermlTimeseries,
  type GaugingRecord, type Rating, type RatingRecord, type ReadingExportRow, type ReadingRecord, type SiteRecord,
} from '../../../core';
import { validateWaterml } from '../../support/waterml-kit';

const END = Date.UTC(2026, 10, 20, 6, 7);
const MADE = Date.UTC(2026, 10, 21);
const env = (n: number) => ({ rev: `${String(MADE).padStart(13, '0')}-${String(n).padStart(6, '0')}-test`, updated_ms: MADE });

/** The demo scenario as stored records, readings with their discharge through the demo rating. */
function demo() {
  const s = demoScenario(END);
  const site: SiteRecord = { ...s.site, ...env(0) };
  const rating: RatingRecord = { ...s.rating, ...env(1) };
  const gaugings: GaugingRecord[] = s.gaugings.map((g, i) => ({ ...g, ...env(10 + i) }));
  // The stage record (core's join of the check readings and the logger days) as export rows.
  const readings: ReadingExportRow[] = stageExportRows(stageRecordWithDischarge(
    [rating], s.readings.map((r, i): ReadingRecord => ({ ...r, ...env(100 + i) })), s.loggerDays.map((d, i) => ({ ...d, ...env(5000 + i) })),
  ));
  return { site, rating, gaugings, readings };
}

const LISTS = new Set(['wml2:observationMember', 'wml2:point', 'wmlrgs:point', 'wmlrgs:gaugingMember', 'wmlrgs:conversionMember', 'wmlrgs:period', 'wmlrgs:extension', 'swe:field', 'gml:name']);
const xml = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@', parseTagValue: false, isArray: (name) => LISTS.has(name) });

function validate(docs: Record<string, string>): void {
  const dir = mkdtempSync(join(tmpdir(), 'freshet-waterml-'));
  const files = Object.entries(docs).map(([name, text]) => {
    writeFileSync(join(dir, name), text);
    return join(dir, name);
  });
  const r = validateWaterml(files);
  expect(r.output).not.toMatch(/INVALID|ERROR|NOTE/);
  expect(r.status, r.output).toBe(0);
}

/** Every gml:id in a document: valid XML names (NCName: no leading digit, no colon), and unique. */
function expectGoodIds(doc: string): void {
  const ids = [...doc.matchAll(/gml:id="([^"]*)"/g)].map((m) => m[1]);
  expect(ids.length).toBeGreaterThan(0);
  for (const id of ids) expect(id).toMatch(/^[A-Za-z_][A-Za-z0-9_.-]*$/); // XML Namespaces 1.0 NCName (ASCII subset)
  expect(new Set(ids).size).toBe(ids.length);
}

describe('the kit itself', () => {
  it('refuses a document that breaks the schema (so a pass below means something)', () => {
    const d = demo();
    const good = watermlTimeseries({ site: d.site, readings: d.readings.slice(0, 3), generated_ms: MADE });
    const broken = good.replace(/<wml2:metadata><wml2:DocumentMetadata.*?<\/wml2:metadata>/, '');
    const dir = mkdtempSync(join(tmpdir(), 'freshet-waterml-'));
    writeFileSync(join(dir, 'broken.xml'), broken);
    const r = validateWaterml([join(dir, 'broken.xml')]);
    expect(r.status).toBe(1);
    expect(r.output).toMatch(/INVALID/);
  });
});

describe('Part 1: time series', () => {
  const d = demo();
  const doc = watermlTimeseries({ site: d.site, readings: d.readings, generated_ms: MADE });

  it('validates against the WaterML 2.0 Part 1 schema, with valid unique gml:ids', () => {
    validate({ 'demo-part1.xml': doc });
    expectGoodIds(doc);
  });

  it('reads back every reading: times with the site offset, values, uom codes, interpolation, quality', () => {
    const root = xml.parse(doc)['wml2:Collection'];
    const obs = root['wml2:observationMember'].map((m: Record<string, any>) => m['om:OM_Observation']);
    // logger and staff: a stage and a discharge series each
    expect(obs).toHaveLength(4);
    const series = (title: string, source: string) => obs.find((o: any) => o['om:observedProperty']['@xlink:title'].startsWith(title) && o['gml:description'].includes(`${source} ${source === 'logger' ? 'values' : 'readings'}`))['om:result']['wml2:MeasurementTimeseries'];
    const loggerStage = series('Stage', 'logger');
    const defaults = loggerStage['wml2:defaultPointMetadata']['wml2:DefaultTVPMeasurementMetadata'];
    expect(defaults['wml2:uom']['@code']).toBe('m'); // UCUM
    expect(defaults['wml2:interpolationType']['@xlink:href']).toBe('http://www.opengis.net/def/waterml/2.0/interpolationType/Continuous');
    const logger = d.readings.filter((r) => r.reading.source === 'logger');
    const points = loggerStage['wml2:point'].map((p: any) => p['wml2:MeasurementTVP']);
    expect(points).toHaveLength(logger.length);
    points.forEach((p: any, i: number) => {
      expect(p['wml2:time']).toBe(toIsoWithOffset(logger[i].reading.time_ms, 'Pacific/Auckland'));
      expect(Number(p['wml2:value'])).toBe(logger[i].reading.stage_m);
    });
    expect(points[0]['wml2:time']).toMatch(/\+1[23]:00$/); // NZST/NZDT offset, IANA tz database
    const discharge = series('Discharge', 'logger');
    expect(discharge['wml2:defaultPointMetadata']['wml2:DefaultTVPMeasurementMetadata']['wml2:uom']['@code']).toBe('m3/s');
    const q = discharge['wml2:point'].map((p: any) => p['wml2:MeasurementTVP']);
    // Discharges to three significant figures, what a rating supports (common practice).
    q.forEach((p: any, i: number) => expect(Number(p['wml2:value'])).toBe(Number(logger[i].discharge_m3s.toPrecision(3))));
    // The storm peak lies above the gauged range (demo model): extrapolated points say so.
    const extrapolated = logger.map((r, i) => (r.extrapolated ? i : -1)).filter((i) => i >= 0);
    expect(extrapolated.length).toBeGreaterThan(0);
    for (const i of extrapolated) {
      const m = q[i]['wml2:metadata']['wml2:TVPMeasurementMetadata'];
      expect(m['wml2:quality']['@xlink:href']).toBe('http://www.opengis.net/def/waterml/2.0/quality/estimate');
      expect(m['wml2:comment']).toMatch(/Extrapolated/);
    }
  });

  it('escapes hostile text, prefixes ids that start with a digit, and marks per-point quality', () => {
    const site: SiteRecord = { ...d.site, id: '0a1b2c3d-0000-4000-8000-000000000009', code: '<PB&"03\'>', name: ']]> & <script>', location: undefined };
    const readings: ReadingExportRow[] = [
      { reading: { ...d.readings[0].reading, quality: 'fair', note: '<b>' }, discharge_m3s: NO_DISCHARGE, shift_m: 0, extrapolated: false },
      { reading: { ...d.readings[1].reading, quality: 'estimated' }, discharge_m3s: 0.2, shift_m: 0, extrapolated: false },
    ];
    const text = watermlTimeseries({ site, readings, generated_ms: MADE, generationSystem: 'Freshet <test>' });
    validate({ 'hostile-part1.xml': text });
    expectGoodIds(text);
    const root = xml.parse(text)['wml2:Collection'];
    expect(root['gml:description']).toContain('<PB&"03\'>');
    const [stage] = root['wml2:observationMember'].map((m: any) => m['om:OM_Observation']['om:result']['wml2:MeasurementTimeseries']);
    const quality = stage['wml2:point'].map((p: any) => p['wml2:MeasurementTVP']['wml2:metadata']['wml2:TVPMeasurementMetadata']['wml2:quality']);
    // WaterML 2.0 Part 1 quality code list: fair → suspect, estimated → estimate; the grade kept as the title
    expect(quality.map((q: any) => q['@xlink:href'].split('/').pop())).toEqual(['suspect', 'estimate']);
    expect(quality.map((q: any) => q['@xlink:title'])).toEqual(['fair', 'estimated']);
    expect(() => watermlTimeseries({ site, readings: [], generated_ms: MADE })).toThrow(/no readings/);
  });
});

/** Linear interpolation in a table of (x, y) with x ascending. */
function interpolate(table: readonly { x: number; y: number }[], x: number): number {
  let j = 1;
  while (j < table.length - 1 && table[j].x < x) j++;
  const a = table[j - 1];
  const b = table[j];
  return a.y + ((x - a.x) / (b.x - a.x)) * (b.y - a.y);
}

describe('Part 2: ratings and gaugings', () => {
  const d = demo();
  const later: RatingRecord = {
    ...d.rating, ...env(2), id: '9f000000-0000-4000-8000-000000000002', validFrom_ms: END - 5 * 86_400_000, fittedFrom: [], note: 'after the flood <re-surveyed>',
    segments: [{ fromStage_m: 0.1, coefficient: 4.2, offset_m: 0.1, exponent: 1.9 }], gaugedRange_m: [0.2, 1.1],
    shifts: [
      { time_ms: END - 4 * 86_400_000, curve: { points: [{ stage_m: 0.3, shift_m: 0.02 }, { stage_m: 0.9, shift_m: 0 }] }, toNext: 'prorate' },
      { time_ms: END - 2 * 86_400_000, curve: { points: [{ stage_m: 0, shift_m: -0.01 }] }, toNext: 'hold' },
    ],
  };
  const doc = watermlRatings({ site: d.site, ratings: [later, d.rating], gaugings: d.gaugings, generated_ms: MADE });
  const root = xml.parse(doc)['wmlrgs:Collection'];
  const tables = root['wmlrgs:conversionMember'].map((m: any) => m['wmlrgs:ConversionTable']);

  it('validates against the WaterML 2.0 Part 2 schema, with valid unique gml:ids', () => {
    validate({ 'demo-part2.xml': doc });
    expectGoodIds(doc);
  });

  it('gives each rating and shift its period of validity, in order', () => {
    const periods = root['wmlrgs:groupMember']['wmlrgs:ConversionGroup']['wmlrgs:period'].map((p: any) => p['wmlrgs:ConversionPeriod']);
    const at = (t: number) => toIsoWithOffset(t, 'Pacific/Auckland');
    expect(periods.map((p: any) => p['wmlrgs:periodStart']['gml:TimeInstant']['gml:timePosition'])).toEqual([
      at(d.rating.validFrom_ms), at(later.validFrom_ms), at(later.shifts[0].time_ms), at(later.shifts[1].time_ms),
    ]);
    expect(periods[0]['wmlrgs:periodEnd']['gml:TimeInstant']['gml:timePosition']).toBe(at(later.validFrom_ms));
    expect(periods[1]['wmlrgs:periodEnd']).toBeUndefined(); // the latest rating is open-ended
    expect(periods[2]['wmlrgs:periodEnd']['gml:TimeInstant']['gml:timePosition']).toBe(at(later.shifts[1].time_ms));
    expect(periods[0]['wmlrgs:applicableConversion']['@xlink:href']).toBe(`#rating-${d.rating.id}`);
  });

  it('states the power-law coefficients of every segment', () => {
    const demoTable = tables.find((t: any) => t['@gml:id'] === `rating-${d.rating.id}`);
    const records = demoTable['wmlrgs:extension'].map((e: any) => e['om:NamedValue']['om:value']['swe:DataRecord']['swe:field']);
    expect(records).toHaveLength(2);
    records.forEach((fields: any[], k: number) => {
      const v = Object.fromEntries(fields.map((f) => [f['@name'], Number(f['swe:Quantity']['swe:value'])]));
      const s = d.rating.segments[k];
      expect(v).toEqual({ fromStage: s.fromStage_m, coefficient: s.coefficient, offset: s.offset_m, exponent: s.exponent });
    });
  });

  it('tabulates the demo rating finely enough: linear interpolation within 0.1 % or 0.1 L/s everywhere (dense scan)', () => {
    const demoTable = tables.find((t: any) => t['@gml:id'] === `rating-${d.rating.id}`);
    const points = demoTable['wmlrgs:point'].map((p: any) => ({
      x: Number(p['wmlrgs:TableTuple']['wmlrgs:inputValue']['swe:Quantity']['swe:value']),
      y: Number(p['wmlrgs:TableTuple']['wmlrgs:outputValue']['swe:Quantity']['swe:value']),
      extrapolated: p['wmlrgs:TableTuple']['wmlrgs:outputValue']['swe:Quantity']['swe:quality'] !== undefined,
    }));
    expect(points[0]).toEqual({ x: 0.12, y: 0, extrapolated: true }); // zero flow at the offset, below the gauged range
    for (const p of points) expect(p.extrapolated).toBe(p.x < 0.24 || p.x > 1.42);
    const lo = points[0].x;
    const hi = points[points.length - 1].x;
    for (let k = 0; k <= 20_000; k++) {
      const h = lo + ((hi - lo) * k) / 20_000;
      const q = dischargeAt(d.rating, h);
      expect(Math.abs(interpolate(points, h) - q)).toBeLessThanOrEqual(Math.max(0.001 * q, 0.0001) + 1e-12);
    }
  });

  it('holds the same bound for a concave law from 5 mm above zero flow', () => {
    // A law with b < 1 (outside usual practice: exponents are 1.3–2.5, Rantz 1982, from memory) is
    // infinitely steep at zero flow: a table on a 1 mm grid cannot follow its first few millimetres
    // (stated in ratingConversionPoints); above them the bound holds.
    const rating: Rating = { segments: [{ fromStage_m: 0, coefficient: 3, offset_m: -0.2, exponent: 0.7 }] };
    const pts = ratingConversionPoints(rating, 3).map((p) => ({ x: p.stage_m, y: p.discharge_m3s }));
    expect(pts[1].x).toBeCloseTo(-0.199, 12);
    for (let k = 0; k <= 5000; k++) {
      const h = -0.195 + ((3 + 0.195) * k) / 5000;
      const q = dischargeAt(rating, h);
      expect(Math.abs(interpolate(pts, h) - q)).toBeLessThanOrEqual(Math.max(0.001 * q, 0.0001) + 1e-12);
    }
  });

  it('holds the same bound for steep and three-segment power laws', () => {
    const ratings: Rating[] = [
      { segments: [{ fromStage_m: 0.3, coefficient: 40, offset_m: 0.3, exponent: 3.1 }] },
      { segments: [
        { fromStage_m: 0.05, coefficient: 2, offset_m: 0.05, exponent: 2.5 },
        { fromStage_m: 0.4, coefficient: 3.1, offset_m: 0.1, exponent: 1.6 },
        { fromStage_m: 1.5, coefficient: 9, offset_m: 0.6, exponent: 1.4 },
      ], gaugedRange_m: [0.2, 2] },
    ];
    for (const rating of ratings) {
      const pts = ratingConversionPoints(rating, 3).map((p) => ({ x: p.stage_m, y: p.discharge_m3s }));
      for (let i = 1; i < pts.length; i++) expect(pts[i].x).toBeGreaterThan(pts[i - 1].x);
      for (let k = 0; k <= 5000; k++) {
        const h = pts[0].x + ((pts[pts.length - 1].x - pts[0].x) * k) / 5000;
        const q = dischargeAt(rating, h);
        // Continuity is not required of a hand-entered rating: only the 1 mm intervals around a jump may exceed.
        const nearJump = rating.segments.some((s) => Math.abs(h - s.fromStage_m) < 0.001);
        if (!nearJump) expect(Math.abs(interpolate(pts, h) - q)).toBeLessThanOrEqual(Math.max(0.001 * q, 0.0001) + 1e-12);
      }
    }
  });

  it('writes each gauging as an observation of stage and discharge with its grade', () => {
    const obs = root['wmlrgs:gaugingMember'].map((m: any) => m['om:OM_Observation']);
    expect(obs).toHaveLength(d.gaugings.length);
    obs.forEach((o: any, i: number) => {
      const g = d.gaugings[i];
      expect(o['om:phenomenonTime']['gml:TimeInstant']['gml:timePosition']).toBe(toIsoWithOffset(g.time_ms, 'Pacific/Auckland'));
      expect(o['om:procedure']['wmlrgs:GaugingProcess']).toBeDefined();
      const r = o['om:result']['wmlrgs:Gauging'];
      expect(Number(r['wmlrgs:inputValue']['swe:Quantity']['swe:value'])).toBe(g.meanStage_m);
      expect(Number(r['wmlrgs:outputValue']['swe:Quantity']['swe:value'])).toBe(g.discharge_m3s);
      expect(r['wmlrgs:outputValue']['swe:Quantity']['swe:quality']['swe:Category']['swe:value']).toBe(g.grade);
    });
    // The demo rating was fitted from these gaugings: its metadata points at each of them.
    const demoTable = tables.find((t: any) => t['@gml:id'] === `rating-${d.rating.id}`);
    const included = demoTable['wmlrgs:metadata']['wmlrgs:ConversionMetadata']['wmlrgs:includedGaugings'];
    expect(included.map((x: any) => x['@xlink:href'])).toEqual(d.gaugings.map((g) => `#gauging-${g.id}`));
  });

  it('writes a shift as stage to shifted stage, exact at its curve points and constant beyond', () => {
    const shift = tables.find((t: any) => t['@gml:id'] === `shift-${later.id}-1`);
    const pts = shift['wmlrgs:point'].map((p: any) => [
      Number(p['wmlrgs:TableTuple']['wmlrgs:inputValue']['swe:Quantity']['swe:value']),
      Number(p['wmlrgs:TableTuple']['wmlrgs:outputValue']['swe:Quantity']['swe:value']),
    ]);
    expect(pts).toContainEqual([0.3, 0.32]);
    expect(pts).toContainEqual([0.9, 0.9]);
    expect(pts[0]).toEqual([0.1, 0.12]); // below the first curve point the shift holds at +0.02 m
    expect(shift['gml:description']).toMatch(/moves linearly in time/);
    expect(doc).toContain('after the flood &lt;re-surveyed&gt;');
  });
});
