// Choosing the site to record at, nearest first once the phone's location is known.
import { useMemo, useState } from 'preact/hooks';
import { listSites } from '../../db';
import { useRecords } from '../../components/use-records';
import { href } from '../../router';
import { locationProblem } from '../../plain-words';

/** Great-circle distance in km between two points (haversine, mean Earth radius 6371.0088 km). */
function distance_km(a: { lat: number; lon: number }, b: { lat: number; lon: number }): number {
  const rad = Math.PI / 180;
  const dLat = (b.lat - a.lat) * rad;
  const dLon = (b.lon - a.lon) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * rad) * Math.cos(b.lat * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * 6371.0088 * Math.asin(Math.min(1, Math.sqrt(h)));
}

/** Picks the site to record at, when the route names none; nearest first once the location is known. */
export function ChooseSite() {
  const sites = useRecords(() => listSites(), ['site'], []);
  const [here, setHere] = useState<{ lat: number; lon: number }>();
  const [locating, setLocating] = useState<string>();
  const ordered = useMemo(() => {
    if (sites.state !== 'ready') return [];
    const withKm = sites.value.map((s) => ({ s, km: here && s.location ? distance_km(here, s.location) : undefined }));
    if (here) withKm.sort((a, b) => (a.km ?? Infinity) - (b.km ?? Infinity));
    return withKm;
  }, [sites, here]);
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>Record a reading</h2>
      {sites.state === 'loading' && <p aria-busy="true">Reading the sites…</p>}
      {sites.state === 'failed' && <p class="callout bad" role="alert">{sites.message}</p>}
      {sites.state === 'ready' && sites.value.length === 0 && (
        <p>There is no site on this phone yet. <a href={href('sites')}>Add a site or load the demo site</a> first.</p>
      )}
      {sites.state === 'ready' && sites.value.length > 0 && (
        <>
          <p>Which site are you at?</p>
          {'geolocation' in navigator && !here && (
            <button
              type="button"
              class="wide"
              onClick={() => {
                setLocating('Finding your location…');
                navigator.geolocation.getCurrentPosition(
                  (p) => {
                    setHere({ lat: p.coords.latitude, lon: p.coords.longitude });
                    setLocating(undefined);
                  },
                  (err) => setLocating(`${locationProblem(err)} The sites stay in code order.`),
                  { enableHighAccuracy: false, timeout: 20_000, maximumAge: 300_000 },
                );
              }}
            >
              Nearest first
            </button>
          )}
          {locating && <p class="muted" role="status">{locating}</p>}
          <ul class="list card" aria-label="Sites">
            {ordered.map(({ s, km }) => (
              <li key={s.id}>
                <a class="item" href={href('record', s.id)}>
                  <span><strong>{s.name}</strong><span class="hint">{s.code}</span></span>
                  <span>{km !== undefined ? `${km < 10 ? km.toFixed(1) : Math.round(km)} km` : <span aria-hidden="true">›</span>}</span>
                </a>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}

