// Routes: every page is a pattern in one table; a damaged or unknown link finds the "no such page"
// screen instead of throwing (a malformed percent-escape once blanked the app). Cases are RFC 3986
// percent-encoding and the app's own link builder.
import { describe, expect, it } from 'vitest';
import { href, matchRoute, routeOf } from '../../web/router';
import { ROUTES, screenFor } from '../../web/app/routes';
import { AREAS } from '../../web/app/areas';

const ID = '0b6f1f3e-6a53-4f7c-9a53-1d2f6e1b7c10';

describe('routeOf', () => {
  it('decodes each segment and reads an empty hash as the sites list', () => {
    expect(routeOf('#/sites/a%20b')).toEqual({ path: '/sites/a%20b', segments: ['sites', 'a b'], malformed: false });
    expect(routeOf('').segments).toEqual(['sites']);
    expect(routeOf('#').segments).toEqual(['sites']);
  });
  it('marks a damaged percent-escape as malformed instead of throwing', () => {
    // RFC 3986 §2.1: "%E0%A4%A" is a cut-short UTF-8 escape; decodeURIComponent throws URIError on it.
    expect(() => decodeURIComponent('%E0%A4%A')).toThrow(URIError);
    const r = routeOf('#/sites/%E0%A4%A');
    expect(r.malformed).toBe(true);
    expect(screenFor(r).title).toBe('No such page');
    expect(screenFor(r).area).toBeUndefined();
  });
});

describe('the route table', () => {
  it('sends each link the app builds to its page with its params', () => {
    const at = (link: string) => {
      const m = screenFor(routeOf(link));
      return { area: m.area, params: m.params };
    };
    expect(at(href('sites'))).toEqual({ area: 'sites', params: {} });
    expect(at(href('sites', 'new'))).toEqual({ area: 'sites', params: {} });
    expect(at(href('sites', ID))).toEqual({ area: 'sites', params: { siteId: ID } });
    expect(at(href('sites', ID, 'edit'))).toEqual({ area: 'sites', params: { siteId: ID } });
    expect(at(href('record', ID, 'r1'))).toEqual({ area: 'record', params: { siteId: ID, readingId: 'r1' } });
    expect(at(href('storm', ID))).toEqual({ area: 'storm', params: { siteId: ID } });
    expect(screenFor(routeOf(href('sites', 'new'))).Screen).not.toBe(screenFor(routeOf(href('sites', ID))).Screen);
  });
  it('finds no page for unknown paths or extra segments', () => {
    for (const link of ['#/nowhere', '#/sites/x/edit/more', '#/about/x', '#/record/a/b/c']) {
      expect(screenFor(routeOf(link)).title).toBe('No such page');
    }
  });
  it('matches literal parts exactly and takes any one segment for a parameter', () => {
    expect(matchRoute('sites/:siteId/edit', ['sites', 'x', 'edit'])).toEqual({ siteId: 'x' });
    expect(matchRoute('sites/:siteId/edit', ['sites', 'x', 'view'])).toBeUndefined();
    expect(matchRoute('sites', ['sites', 'x'])).toBeUndefined();
  });
  it('gives every area of the bottom bar a home page, and every page an area of the bar', () => {
    const areas = AREAS.map((a) => a.id);
    expect(areas).toEqual(['sites', 'record', 'storm', 'data', 'about']);
    for (const a of areas) expect(ROUTES.some((r) => r.pattern === a)).toBe(true);
    for (const r of ROUTES) expect(areas).toContain(r.area);
  });
});
