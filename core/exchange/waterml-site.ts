// The parts of a WaterML 2.0 document that name the site: its reference (for featureOfInterest and
// monitoringPoint) and, when its location is known, a MonitoringPoint feature.
import type { SiteRecord } from '../records/index';
import { el, gmlId, wrap } from './xml-write';

/** An xlink reference to a site: its URN (built from the record id) and its code and name as the title. */
export function siteLink(site: SiteRecord): { 'xlink:href': string; 'xlink:title': string } {
  return { 'xlink:href': `urn:x-freshet:site:${site.id}`, 'xlink:title': `${site.code} ${site.name}` };
}

/** The gml:id the site's MonitoringPoint gets in a document. */
export function monitoringPointId(site: SiteRecord): string {
  return gmlId('site', site.id);
}

/**
 * A wml2:MonitoringPoint for a site with a location (WGS 84 latitude, longitude), or null without one
 * (the schema needs a shape). The site's datum is stated in its description.
 */
export function monitoringPoint(site: SiteRecord): string | null {
  if (!site.location) return null;
  const id = monitoringPointId(site);
  const datum = site.datum
    ? ` Stage is measured above the gauge datum: ${site.datum.description}${site.datum.elevation_m !== undefined ? ` (${site.datum.elevation_m} m)` : ''}.`
    : '';
  return wrap('wml2:MonitoringPoint', { 'gml:id': id }, [
    el('gml:description', undefined, `Gauging station ${site.code}.${datum}`),
    el('gml:identifier', { codeSpace: 'urn:x-freshet:site' }, site.id),
    el('gml:name', undefined, site.name),
    el('gml:name', { codeSpace: 'urn:x-freshet:site-code' }, site.code),
    el('sam:type', { 'xlink:href': 'http://www.opengis.net/def/samplingFeatureType/OGC-OM/2.0/SF_SamplingPoint' }),
    el('sam:sampledFeature', { 'xlink:href': 'http://www.opengis.net/def/nil/OGC/0/unknown', 'xlink:title': 'the stream at the gauge' }),
    wrap('sams:shape', undefined, [
      wrap('gml:Point', { 'gml:id': gmlId('point', site.id), srsName: 'http://www.opengis.net/def/crs/EPSG/0/4326' }, [
        el('gml:pos', undefined, `${site.location.lat} ${site.location.lon}`),
      ]),
    ]),
  ]);
}
