// A site's readings and discharges as an OGC WaterML 2.0 Part 1 document (OGC 10-126r4): a wml2:Collection
// with one OM_Observation per series, each with a MeasurementTimeseries result of time–value pairs,
// times with the site's UTC offset, UCUM unit codes, the interpolation type, and per-point quality.
import { hasDischarge } from '../rating/index';
import type { ReadingQuality, ReadingSource, SiteRecord } from '../records/index';
import { toIsoWithOffset } from '../time/index';
import { isoWithOffsetFormatter } from './iso-times';
import { DISCHARGE_DIGITS, type ReadingExportRow } from './readings-csv';
import { monitoringPoint, monitoringPointId, siteLink } from './waterml-site';
import { el, gmlId, wrap, WATERML_NAMESPACES } from './xml-write';

/** What a Part 1 document holds: the site, its readings with discharge (oldest first), when it is made (UTC ms). */
export interface TimeseriesDocumentInput {
  site: SiteRecord;
  readings: readonly ReadingExportRow[];
  generated_ms: number;
  /** Names the program in the document's metadata. */
  generationSystem?: string;
}

const QUALITY_BASE = 'http://www.opengis.net/def/waterml/2.0/quality/';
const INTERPOLATION = 'http://www.opengis.net/def/waterml/2.0/interpolationType/Continuous';

/**
 * WaterML 2.0 quality code for a reading's grade: good → good, fair → suspect, poor → poor,
 * estimated → estimate (the WaterML 2.0 Part 1 quality code list); the grade itself is kept as the title.
 */
export const WATERML_QUALITY: Record<ReadingQuality, string> = { good: 'good', fair: 'suspect', poor: 'poor', estimated: 'estimate' };

/** Number text for a value element: shortest round-trip form (xs:double accepts it). */
function numberText(v: number): string {
  if (!Number.isFinite(v)) throw new RangeError(`WaterML values must be finite numbers; got ${String(v)}`);
  return String(v);
}

interface SeriesSpec {
  key: string;
  property: string;
  title: string;
  uom: string;
  source: ReadingSource;
  points: { time_ms: number; value: number; quality: ReadingQuality; comment?: string }[];
}

function observation(site: SiteRecord, s: SeriesSpec, generated_ms: number, featureRef: Record<string, string>, iso: (time_ms: number) => string): string {
  const tz = site.timeZone;
  const first = s.points[0].time_ms;
  const last = s.points[s.points.length - 1].time_ms;
  const base = `${s.key}-${s.source}`;
  const points = s.points.map((p) => {
    const meta: string[] = [];
    if (p.quality !== 'good' || p.comment) {
      meta.push(el('wml2:quality', { 'xlink:href': QUALITY_BASE + WATERML_QUALITY[p.quality], 'xlink:title': p.quality }));
      if (p.comment) meta.push(el('wml2:comment', undefined, p.comment));
    }
    return wrap('wml2:point', undefined, [
      wrap('wml2:MeasurementTVP', undefined, [
        el('wml2:time', undefined, iso(p.time_ms)),
        el('wml2:value', undefined, numberText(p.value)),
        ...(meta.length > 0 ? [wrap('wml2:metadata', undefined, [wrap('wml2:TVPMeasurementMetadata', undefined, meta)])] : []),
      ]),
    ]);
  });
  return wrap('wml2:observationMember', undefined, [
    wrap('om:OM_Observation', { 'gml:id': gmlId('obs', base) }, [
      el('gml:description', undefined, `${s.title} at ${site.code}, ${s.source === 'logger' ? 'logger values (drift-corrected: the value read plus the correction from check readings)' : `${s.source} readings`}.`),
      wrap('om:phenomenonTime', undefined, [
        wrap('gml:TimePeriod', { 'gml:id': gmlId('period', base) }, [
          el('gml:beginPosition', undefined, toIsoWithOffset(first, tz)),
          el('gml:endPosition', undefined, toIsoWithOffset(last, tz)),
        ]),
      ]),
      wrap('om:resultTime', undefined, [
        wrap('gml:TimeInstant', { 'gml:id': gmlId('made', base) }, [el('gml:timePosition', undefined, toIsoWithOffset(generated_ms, tz))]),
      ]),
      wrap('om:procedure', undefined, [
        wrap('wml2:ObservationProcess', { 'gml:id': gmlId('process', base) }, [
          el('wml2:processType', {
            'xlink:href': `http://www.opengis.net/def/waterml/2.0/processType/${s.key === 'discharge' ? 'Simulation' : s.source === 'logger' ? 'Sensor' : 'ManualMethod'}`,
            'xlink:title': s.key === 'discharge' ? 'computed from stage through the rating in force' : s.source === 'logger' ? 'water-level logger' : `${s.source} gauge read by hand`,
          }),
        ]),
      ]),
      el('om:observedProperty', { 'xlink:href': s.property, 'xlink:title': s.title }),
      el('om:featureOfInterest', featureRef),
      wrap('om:result', undefined, [
        wrap('wml2:MeasurementTimeseries', { 'gml:id': gmlId('series', base) }, [
          wrap('wml2:metadata', undefined, [
            wrap('wml2:MeasurementTimeseriesMetadata', undefined, [
              el('wml2:temporalExtent', { 'xlink:href': `#${gmlId('period', base)}` }),
            ]),
          ]),
          wrap('wml2:defaultPointMetadata', undefined, [
            wrap('wml2:DefaultTVPMeasurementMetadata', undefined, [
              el('wml2:quality', { 'xlink:href': `${QUALITY_BASE}good`, 'xlink:title': 'good' }),
              el('wml2:uom', { code: s.uom }),
              el('wml2:interpolationType', { 'xlink:href': INTERPOLATION, 'xlink:title': 'Continuous (instantaneous values)' }),
            ]),
          ]),
          ...points,
        ]),
      ]),
    ]),
  ]);
}

/**
 * The WaterML 2.0 Part 1 document of a site's readings: for each reading source, a stage series (m) and,
 * where a rating applied, a discharge series (m³/s; extrapolated values get quality "estimate" and a comment).
 * Throws a RangeError when there are no readings.
 */
export function watermlTimeseries(input: TimeseriesDocumentInput): string {
  const { site, readings, generated_ms } = input;
  if (readings.length === 0) throw new RangeError(`There are no readings of site ${site.code} to write as WaterML`);
  const sources = [...new Set(readings.map((r) => r.reading.source))];
  const mp = monitoringPoint(site);
  const iso = isoWithOffsetFormatter(site.timeZone);
  const featureRef: Record<string, string> = mp ? { 'xlink:href': `#${monitoringPointId(site)}`, 'xlink:title': siteLink(site)['xlink:title'] } : siteLink(site);
  const members: string[] = [];
  for (const source of sources) {
    const of = readings.filter((r) => r.reading.source === source);
    members.push(observation(site, {
      key: 'stage', property: 'urn:x-freshet:property:stage', title: 'Stage (gauge height above the gauge datum)', uom: 'm', source,
      points: of.map((r) => ({ time_ms: r.reading.time_ms, value: r.reading.stage_m, quality: r.reading.quality })),
    }, generated_ms, featureRef, iso));
    const withQ = of.filter((r) => hasDischarge(r.discharge_m3s));
    if (withQ.length > 0) {
      members.push(observation(site, {
        key: 'discharge', property: 'urn:x-freshet:property:discharge', title: 'Discharge', uom: 'm3/s', source,
        points: withQ.map((r) => ({
          time_ms: r.reading.time_ms, value: Number(r.discharge_m3s.toPrecision(DISCHARGE_DIGITS)),
          quality: r.extrapolated ? 'estimated' : r.reading.quality,
          comment: r.extrapolated ? 'Extrapolated beyond the gauged range of the rating.' : undefined,
        })),
      }, generated_ms, featureRef, iso));
    }
  }
  const doc = wrap('wml2:Collection', { ...WATERML_NAMESPACES, 'xsi:schemaLocation': 'http://www.opengis.net/waterml/2.0 http://schemas.opengis.net/waterml/2.0/waterml2.xsd', 'gml:id': gmlId('collection', site.id) }, [
    el('gml:description', undefined, `Stage and discharge at ${site.code} (${site.name}). Discharges are estimates from the rating in force at each time; they defer to approved methods and local practice.`),
    wrap('wml2:metadata', undefined, [
      wrap('wml2:DocumentMetadata', { 'gml:id': gmlId('document', site.id) }, [
        el('wml2:generationDate', undefined, toIsoWithOffset(generated_ms, site.timeZone)),
        el('wml2:version', { 'xlink:href': 'http://www.opengis.net/waterml/2.0', 'xlink:title': 'WaterML 2.0' }),
        el('wml2:generationSystem', undefined, input.generationSystem ?? 'Freshet'),
      ]),
    ]),
    ...(mp ? [wrap('wml2:samplingFeatureMember', undefined, [mp])] : []),
    ...members,
  ]);
  return `<?xml version="1.0" encoding="UTF-8"?>\n${doc}\n`;
}
