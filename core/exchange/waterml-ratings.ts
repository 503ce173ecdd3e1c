// A site's ratings and gaugings as an OGC WaterML 2.0 Part 2 document (OGC 15-018r2): a wmlrgs:Collection
// with each gauging as an observation (GaugingProcess, Gauging result), each rating as a ConversionTable
// fine enough for linear interpolation (its power-law coefficients stated beside it), each dated shift
// as a stage-to-shifted-stage table, and one ConversionGroup giving every table its period of validity.
import type { RatingSegment } from '../rating/index';
import type { GaugingRecord, RatingRecord, SiteRecord } from '../records/index';
import { toIsoWithOffset } from '../time/index';
import { DEFAULT_CONVERSION_TOLERANCE, ratingConversionPoints, type ConversionTolerance } from './rating-points';
import { RATING_TABLE_HEADROOM_M } from './ratings-csv';
import { siteLink } from './waterml-site';
import { el, gmlId, wrap, WATERML_NAMESPACES, WATERML_PART2_NAMESPACE } from './xml-write';

/** What a Part 2 document holds: the site, its ratings and gaugings, when it is made (UTC ms), the table's top and tolerance. */
export interface RatingsDocumentInput {
  site: SiteRecord;
  ratings: readonly RatingRecord[];
  gaugings: readonly GaugingRecord[];
  generated_ms: number;
  /** Highest stage of the tables, m (default: each rating's gauged top plus RATING_TABLE_HEADROOM_M). */
  top_m?: number;
  tolerance?: ConversionTolerance;
  generationSystem?: string;
}

const STAGE = { 'xlink:href': 'urn:x-freshet:property:stage', 'xlink:title': 'Stage (gauge height above the gauge datum)' };
const SHIFTED = { 'xlink:href': 'urn:x-freshet:property:shifted-stage', 'xlink:title': 'Stage with the rating shift applied' };
const DISCHARGE = { 'xlink:href': 'urn:x-freshet:property:discharge', 'xlink:title': 'Discharge' };

function quantity(uom: string, value: number, note?: string): string {
  if (!Number.isFinite(value)) throw new RangeError(`WaterML values must be finite numbers; got ${String(value)}`);
  return wrap('swe:Quantity', undefined, [
    ...(note ? [wrap('swe:quality', undefined, [wrap('swe:Text', undefined, [el('swe:value', undefined, note)])])] : []),
    el('swe:uom', { code: uom }),
    el('swe:value', undefined, String(value)),
  ]);
}

function tuple(input: string, output: string): string {
  return wrap('wmlrgs:point', undefined, [
    wrap('wmlrgs:TableTuple', undefined, [wrap('wmlrgs:inputValue', undefined, [input]), wrap('wmlrgs:outputValue', undefined, [output])]),
  ]);
}

function instant(id: string, time_ms: number, tz: string): string {
  return wrap('gml:TimeInstant', { 'gml:id': id }, [el('gml:timePosition', undefined, toIsoWithOffset(time_ms, tz))]);
}

/** The segment's equation in words, e.g. "Q = 6·(h + shift − 0.12)^2.2 from 0.12 m". */
export function segmentEquation(s: RatingSegment): string {
  const e = s.offset_m < 0 ? `+ ${-s.offset_m}` : `− ${s.offset_m}`;
  return `Q = ${s.coefficient}·(h + shift ${e})^${s.exponent} from ${s.fromStage_m} m`;
}

function segmentRecord(s: RatingSegment, k: number): string {
  const field = (name: string, uom: { code: string } | { 'xlink:href': string; 'xlink:title': string }, value: number) =>
    wrap('swe:field', { name }, [wrap('swe:Quantity', undefined, [el('swe:uom', uom), el('swe:value', undefined, String(value))])]);
  return wrap('wmlrgs:extension', undefined, [
    wrap('om:NamedValue', undefined, [
      el('om:name', { 'xlink:href': 'urn:x-freshet:rating:power-law-segment', 'xlink:title': `segment ${k + 1}: ${segmentEquation(s)} (h and offset in m, Q in m³/s)` }),
      wrap('om:value', undefined, [
        wrap('swe:DataRecord', undefined, [
          field('fromStage', { code: 'm' }, s.fromStage_m),
          field('coefficient', { 'xlink:href': 'urn:x-freshet:unit:m3s-per-m-to-the-exponent', 'xlink:title': 'm³/s per m^exponent' }, s.coefficient),
          field('offset', { code: 'm' }, s.offset_m),
          field('exponent', { code: '1' }, s.exponent),
        ]),
      ]),
    ]),
  ]);
}

function gaugingMember(site: SiteRecord, g: GaugingRecord): string {
  const tz = site.timeZone;
  return wrap('wmlrgs:gaugingMember', undefined, [
    wrap('om:OM_Observation', { 'gml:id': gmlId('gauging', g.id) }, [
      el('gml:description', undefined, `Gauging by ${g.method}, graded ${g.grade}${g.observer ? `, by ${g.observer}` : ''}${g.note ? `. ${g.note}` : ''}`),
      wrap('om:phenomenonTime', undefined, [instant(gmlId('gauged', g.id), g.time_ms, tz)]),
      el('om:resultTime', { 'xlink:href': `#${gmlId('gauged', g.id)}` }),
      wrap('om:procedure', undefined, [
        wrap('wmlrgs:GaugingProcess', { 'gml:id': gmlId('gauging-process', g.id) }, [
          el('wml2:processType', { 'xlink:href': 'http://www.opengis.net/def/waterml/2.0/processType/ManualMethod', 'xlink:title': 'discharge measurement' }),
          el('wmlrgs:outputPropertyMethod', { 'xlink:href': `urn:x-freshet:gauging-method:${g.method}`, 'xlink:title': g.method }),
        ]),
      ]),
      el('om:observedProperty', { 'xlink:href': 'urn:x-freshet:property-pair:stage-discharge', 'xlink:title': 'stage and discharge' }),
      el('om:featureOfInterest', siteLink(site)),
      wrap('om:result', undefined, [
        wrap('wmlrgs:Gauging', undefined, [
          wrap('wmlrgs:inputValue', undefined, [quantity('m', g.meanStage_m)]),
          wrap('wmlrgs:outputValue', undefined, [
            wrap('swe:Quantity', undefined, [
              wrap('swe:quality', undefined, [
                wrap('swe:Category', undefined, [
                  el('swe:codeSpace', { 'xlink:href': 'urn:x-freshet:measurement-grade' }),
                  el('swe:value', undefined, g.grade),
                ]),
              ]),
              el('swe:uom', { code: 'm3/s' }),
              el('swe:value', undefined, String(g.discharge_m3s)),
            ]),
          ]),
        ]),
      ]),
    ]),
  ]);
}

/**
 * The WaterML 2.0 Part 2 document of a site's ratings (by validFrom_ms) and gaugings (by time). Each rating
 * is valid from its start until the next one starts; each dated shift from its time until the next shift
 * or the rating's end. Throws a RangeError when there is neither a rating nor a gauging.
 */
export function watermlRatings(input: RatingsDocumentInput): string {
  const { site, generated_ms } = input;
  const tz = site.timeZone;
  const tol = input.tolerance ?? DEFAULT_CONVERSION_TOLERANCE;
  const ratings = [...input.ratings].sort((a, b) => a.validFrom_ms - b.validFrom_ms);
  const gaugings = [...input.gaugings].sort((a, b) => a.time_ms - b.time_ms);
  if (ratings.length === 0 && gaugings.length === 0) throw new RangeError(`Site ${site.code} has no ratings or gaugings to write as WaterML`);
  const mp = { 'xlink:href': siteLink(site)['xlink:href'], 'xlink:title': siteLink(site)['xlink:title'] };
  const gaugingIds = new Set(gaugings.map((g) => g.id));
  const conversions: string[] = [];
  const periods: string[] = [];
  const period = (key: string, from_ms: number, to_ms: number | null, table: string) =>
    wrap('wmlrgs:period', undefined, [
      wrap('wmlrgs:ConversionPeriod', undefined, [
        wrap('wmlrgs:periodStart', undefined, [instant(gmlId('from', key), from_ms, tz)]),
        ...(to_ms === null ? [] : [wrap('wmlrgs:periodEnd', undefined, [instant(gmlId('to', key), to_ms, tz)])]),
        el('wmlrgs:applicableConversion', { 'xlink:href': `#${table}` }),
      ]),
    ]);
  ratings.forEach((r, i) => {
    const end = i + 1 < ratings.length ? ratings[i + 1].validFrom_ms : null;
    const last = r.segments[r.segments.length - 1].fromStage_m;
    const top = input.top_m ?? Math.max(r.gaugedRange_m?.[1] ?? last, last) + RATING_TABLE_HEADROOM_M;
    const points = ratingConversionPoints(r, top, tol);
    const table = gmlId('rating', r.id);
    const used = r.fittedFrom.filter((id) => gaugingIds.has(id));
    const gauged = r.gaugedRange_m ? ` Gauged from ${r.gaugedRange_m[0]} m to ${r.gaugedRange_m[1]} m; points outside are marked as extrapolated.` : '';
    conversions.push(wrap('wmlrgs:conversionMember', undefined, [
      wrap('wmlrgs:ConversionTable', { 'gml:id': table }, [
        el('gml:description', undefined,
          `Stage–discharge rating of ${site.code} in force from ${toIsoWithOffset(r.validFrom_ms, tz)}: ${r.segments.map(segmentEquation).join('; ')} (h and offsets in m, Q in m³/s, no shift in this table).` +
          ` Tabulated every ≥1 mm so that linear interpolation stays within ${tol.relative * 100} % or ${tol.absolute_m3s} m³/s of the curve.${gauged}${r.note ? ` ${r.note}` : ''}`),
        el('gml:identifier', { codeSpace: 'urn:x-freshet:rating' }, r.id),
        el('wmlrgs:monitoringPoint', mp),
        el('wmlrgs:inputProperty', STAGE),
        el('wmlrgs:outputProperty', DISCHARGE),
        wrap('wmlrgs:metadata', undefined, [
          wrap('wmlrgs:ConversionMetadata', { 'gml:id': gmlId('rating-metadata', r.id) }, [
            ...used.map((id) => el('wmlrgs:includedGaugings', { 'xlink:href': `#${gmlId('gauging', id)}` })),
            el('wmlrgs:developmentMethod', {
              'xlink:href': used.length > 0 ? 'urn:x-freshet:rating-method:power-law-fit' : 'urn:x-freshet:rating-method:entered',
              'xlink:title': used.length > 0 ? 'power law fitted to gaugings in log space' : 'power law entered by hand',
            }),
            el('wmlrgs:versionIdentifier', undefined, r.rev),
          ]),
        ]),
        ...r.segments.map(segmentRecord),
        ...points.map((p) => tuple(quantity('m', p.stage_m), quantity('m3/s', p.discharge_m3s, p.extrapolated ? 'extrapolated beyond the gauged range' : undefined))),
      ]),
    ]));
    periods.push(period(`rating-${r.id}`, r.validFrom_ms, end, table));
    r.shifts.forEach((s, k) => {
      const key = `${r.id}-${k + 1}`;
      const shiftTable = gmlId('shift', key);
      const shiftEnd = k + 1 < r.shifts.length ? r.shifts[k + 1].time_ms : end;
      const stages = [...new Set([points[0].stage_m, ...s.curve.points.map((p) => p.stage_m), points[points.length - 1].stage_m])].sort((a, b) => a - b);
      const at = (h: number) => {
        const c = s.curve.points;
        if (h <= c[0].stage_m) return c[0].shift_m;
        if (h >= c[c.length - 1].stage_m) return c[c.length - 1].shift_m;
        let j = 1;
        while (c[j].stage_m < h) j++;
        return c[j - 1].shift_m + ((h - c[j - 1].stage_m) / (c[j].stage_m - c[j - 1].stage_m)) * (c[j].shift_m - c[j - 1].shift_m);
      };
      conversions.push(wrap('wmlrgs:conversionMember', undefined, [
        wrap('wmlrgs:ConversionTable', { 'gml:id': shiftTable }, [
          el('gml:description', undefined, `Shift ${k + 1} of the rating from ${toIsoWithOffset(r.validFrom_ms, tz)}: stage to shifted stage (m), linear between points and constant beyond them.${s.toNext === 'prorate' && shiftEnd !== null ? ' The shift moves linearly in time to the next shift over its period; this table is its value at the period\u2019s start.' : ''}`),
          el('wmlrgs:monitoringPoint', mp),
          el('wmlrgs:inputProperty', STAGE),
          el('wmlrgs:outputProperty', SHIFTED),
          ...stages.map((h) => tuple(quantity('m', h), quantity('m', Number((h + at(h)).toFixed(6))))),
        ]),
      ]));
      periods.push(period(`shift-${key}`, s.time_ms, shiftEnd, shiftTable));
    });
  });
  const group = periods.length === 0 ? [] : [wrap('wmlrgs:groupMember', undefined, [
    wrap('wmlrgs:ConversionGroup', { 'gml:id': gmlId('ratings', site.id) }, [
      el('gml:description', undefined, `The ratings of ${site.code} and their periods of validity; dated shifts are applied to the stage before the rating.`),
      el('wmlrgs:monitoringPoint', mp),
      el('wmlrgs:fullConversion', undefined, 'false'),
      ...periods,
    ]),
  ])];
  const doc = wrap('wmlrgs:Collection', {
    ...WATERML_NAMESPACES, ...WATERML_PART2_NAMESPACE,
    'xsi:schemaLocation': 'http://www.opengis.net/waterml/part2/1.0 http://schemas.opengis.net/waterml/part2/1.0/waterml2-part2.xsd',
    'gml:id': gmlId('rating-collection', site.id),
  }, [
    el('gml:description', undefined, `Ratings and gaugings of ${site.code} (${site.name}). Ratings are estimates that defer to approved methods and local practice.`),
    wrap('wml2:metadata', undefined, [
      wrap('wml2:DocumentMetadata', { 'gml:id': gmlId('rating-document', site.id) }, [
        el('wml2:generationDate', undefined, toIsoWithOffset(generated_ms, tz)),
        el('wml2:version', { 'xlink:href': 'http://www.opengis.net/waterml/part2/1.0', 'xlink:title': 'WaterML 2.0 Part 2' }),
        el('wml2:generationSystem', undefined, input.generationSystem ?? 'Freshet'),
      ]),
    ]),
    ...gaugings.map((g) => gaugingMember(site, g)),
    ...conversions,
    ...group,
  ]);
  return `<?xml version="1.0" encoding="UTF-8"?>\n${doc}\n`;
}
