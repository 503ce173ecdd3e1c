// The reading's optional location: asked of the phone on a tap, shown with its accuracy, removable.
import { useState } from 'preact/hooks';
import type { ReadingRecord } from '../../../core';
import { locationProblem } from '../../plain-words';

type Gps = NonNullable<ReadingRecord['gps']>;

/** Props: the location kept with the form (or none) and how to change it. */
export interface LocationFieldProps {
  value?: Gps;
  onChange: (value: Gps | undefined) => void;
}

/** "Add location" or the location with "Remove location", and what the phone said while finding it. */
export function LocationField({ value, onChange }: LocationFieldProps) {
  const [state, setState] = useState<string>();
  function addLocation() {
    if (!('geolocation' in navigator)) {
      setState('This phone gives no location to the browser.');
      return;
    }
    setState('Finding your location…');
    navigator.geolocation.getCurrentPosition(
      (p) => {
        onChange({ lat: p.coords.latitude, lon: p.coords.longitude, accuracy_m: p.coords.accuracy, time_ms: Math.round(p.timestamp) });
        setState(undefined);
      },
      (err) => setState(`${locationProblem(err)} The reading can be saved without it.`),
      { enableHighAccuracy: true, timeout: 30_000, maximumAge: 60_000 },
    );
  }
  return (
    <>
      {value ? (
        <p class="callout" data-testid="gps">
          Location {value.lat.toFixed(5)}, {value.lon.toFixed(5)} (± {Math.round(value.accuracy_m)} m){' '}
          <button type="button" onClick={() => onChange(undefined)}>Remove location</button>
        </p>
      ) : (
        <button type="button" class="wide" onClick={addLocation}>Add location</button>
      )}
      {state && <p class="muted" role="status">{state}</p>}
    </>
  );
}
