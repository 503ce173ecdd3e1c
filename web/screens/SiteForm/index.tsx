// Create or edit a site: every site field, with units chosen per site; delete with confirmation.
import { useEffect, useMemo, useState } from 'preact/hooks';
import {
  fromDisplay, isTimeZone, MAX_AREA_KM2, MAX_DATUM_ELEVATION_M, MAX_JUMP_LIMIT_M, MIN_DATUM_ELEVATION_M, RecordValidationError, toDisplay, displayUnit,
  type SiteRecord, type UnitSystem,
} from '../../../core';
import { deleteSite, getSite, saveSite, StorageError } from '../../db';
import { describedBy, Field } from '../../components/Field';
import { decimalProblem, parseDecimal } from '../../format';
import { locationProblem, plainError } from '../../plain-words';
import { href, navigate, type ScreenProps } from '../../router';

interface Form {
  code: string;
  name: string;
  area: string;
  datumDescription: string;
  datumElevation: string;
  lat: string;
  lon: string;
  timeZone: string;
  units: UnitSystem;
  jumpLimit: string;
}

const deviceZone = (): string => Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';

function emptyForm(): Form {
  return { code: '', name: '', area: '', datumDescription: '', datumElevation: '', lat: '', lon: '', timeZone: deviceZone(), units: 'metric', jumpLimit: '0.3' };
}

/** A number as a person types it: up to 6 significant figures, no trailing zeros ("12.4", not "12.4000"). */
function typedText(v: number): string {
  return String(Number(v.toPrecision(6)));
}

/** A number with thousands separators for a range in a sentence ("10,000,000"). */
const rangeText = (v: number): string => Number(v.toPrecision(6)).toLocaleString('en', { maximumFractionDigits: 4 }).replace(/^-/, '−');

function formOf(s: SiteRecord): Form {
  const u = s.displayUnits;
  const show = (q: 'area' | 'stage', v: number | undefined) => (v === undefined ? '' : typedText(toDisplay(q, v, u)));
  return {
    code: s.code, name: s.name, area: show('area', s.area_km2), datumDescription: s.datum?.description ?? '',
    datumElevation: show('stage', s.datum?.elevation_m), lat: s.location ? String(s.location.lat) : '',
    lon: s.location ? String(s.location.lon) : '', timeZone: s.timeZone, units: u, jumpLimit: show('stage', s.jumpLimit_m),
  };
}

type Errors = Partial<Record<keyof Form, string>>;

/** Turns the form into a site body, or the errors that stop it (each naming the field's problem). */
function toSite(f: Form): { site?: Omit<SiteRecord, 'id' | 'rev' | 'updated_ms'>; errors: Errors } {
  const errors: Errors = {};
  const num = (key: keyof Form, text: string, required: boolean, what: string): number | undefined => {
    if (!text.trim()) {
      if (required) errors[key] = `${what} is needed.`;
      return undefined;
    }
    const v = parseDecimal(text);
    if (v === undefined) errors[key] = `${what}: ${decimalProblem(text)}`;
    return v;
  };
  if (!f.code.trim()) errors.code = 'A site code is needed, like "PB-03".';
  if (!f.name.trim()) errors.name = 'A site name is needed.';
  const u = f.units;
  const area = num('area', f.area, false, 'The catchment area');
  const maxArea = toDisplay('area', MAX_AREA_KM2, u);
  if (area !== undefined && (area <= 0 || area > maxArea)) {
    errors.area = `The catchment area must be above 0 and at most ${rangeText(maxArea)} ${displayUnit('area', u)} (the largest river basins are about 7 million km²).`;
  }
  const elevation = num('datumElevation', f.datumElevation, false, 'The datum elevation');
  const [lowDatum, highDatum] = [MIN_DATUM_ELEVATION_M, MAX_DATUM_ELEVATION_M].map((v) => toDisplay('stage', v, u));
  if (elevation !== undefined && (elevation < lowDatum || elevation > highDatum)) {
    errors.datumElevation = `The datum elevation must be from ${rangeText(lowDatum)} to ${rangeText(highDatum)} ${displayUnit('stage', u)}.`;
  }
  const lat = num('lat', f.lat, false, 'The latitude');
  const lon = num('lon', f.lon, false, 'The longitude');
  if ((lat === undefined) !== (lon === undefined) && !errors.lat && !errors.lon) errors.lat = 'Give both latitude and longitude, or neither.';
  if (lat !== undefined && (lat < -90 || lat > 90)) errors.lat = 'The latitude must be between −90 and 90 degrees.';
  if (lon !== undefined && (lon < -180 || lon > 180)) errors.lon = 'The longitude must be between −180 and 180 degrees.';
  if (!isTimeZone(f.timeZone)) errors.timeZone = `"${f.timeZone}" is not a time zone name; choose one from the list.`;
  const jump = num('jumpLimit', f.jumpLimit, true, 'The jump limit');
  const maxJump = toDisplay('stage', MAX_JUMP_LIMIT_M, u);
  if (jump !== undefined && (jump <= 0 || jump > maxJump)) {
    errors.jumpLimit = `The jump limit must be above 0 and at most ${rangeText(maxJump)} ${displayUnit('stage', u)}; ${u === 'us' ? '1 ft' : '0.3 m'} is usual.`;
  }
  if (Object.keys(errors).length) return { errors };
  return {
    errors,
    site: {
      code: f.code.trim(), name: f.name.trim(), timeZone: f.timeZone, displayUnits: u,
      jumpLimit_m: fromDisplay('stage', jump!, u),
      ...(area !== undefined && { area_km2: fromDisplay('area', area, u) }),
      ...(f.datumDescription.trim() || elevation !== undefined
        ? { datum: { description: f.datumDescription.trim(), ...(elevation !== undefined && { elevation_m: fromDisplay('stage', elevation, u) }) } }
        : {}),
      ...(lat !== undefined && lon !== undefined && { location: { lat, lon } }),
    },
  };
}

/** Which form field a stored-record validation error belongs to. */
function fieldOf(err: RecordValidationError): keyof Form {
  const f = err.field;
  if (f.startsWith('area')) return 'area';
  if (f.startsWith('datum.elevation')) return 'datumElevation';
  if (f.startsWith('datum')) return 'datumDescription';
  if (f.startsWith('location.lon')) return 'lon';
  if (f.startsWith('location')) return 'lat';
  if (f.startsWith('timeZone')) return 'timeZone';
  if (f.startsWith('jumpLimit')) return 'jumpLimit';
  if (f.startsWith('name')) return 'name';
  return 'code';
}

/** The site form ('#/sites/new', '#/sites/<siteId>/edit'): with siteId it edits that site, without it creates one. */
export default function SiteForm({ params }: ScreenProps) {
  const siteId = params.siteId;
  const [form, setForm] = useState<Form>(emptyForm);
  const [loaded, setLoaded] = useState(!siteId);
  const [errors, setErrors] = useState<Errors>({});
  const [status, setStatus] = useState<string>();
  const [saving, setSaving] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const zones = useMemo(() => Intl.supportedValuesOf('timeZone'), []);
  useEffect(() => {
    if (!siteId) return;
    void getSite(siteId).then((s) => {
      if (s) setForm(formOf(s));
      setLoaded(true);
    });
  }, [siteId]);
  const set = <K extends keyof Form>(key: K, value: Form[K]) => setForm((f) => ({ ...f, [key]: value }));
  const switchUnits = (u: UnitSystem) =>
    setForm((f) => {
      if (f.units === u) return f;
      // Keep what was typed meaning the same length or area in the new units.
      const conv = (q: 'area' | 'stage', text: string) => {
        const v = parseDecimal(text);
        return v === undefined ? text : typedText(toDisplay(q, fromDisplay(q, v, f.units), u));
      };
      return { ...f, units: u, area: conv('area', f.area), datumElevation: conv('stage', f.datumElevation), jumpLimit: conv('stage', f.jumpLimit) };
    });

  async function onSave(e: Event) {
    e.preventDefault();
    const { site, errors: found } = toSite(form);
    setErrors(found);
    if (!site) {
      setStatus('Nothing was saved: please correct the fields marked below.');
      return;
    }
    setSaving(true);
    try {
      const saved = await saveSite({ ...site, ...(siteId && { id: siteId }) });
      navigate(href('sites', saved.id), true);
    } catch (err) {
      if (err instanceof RecordValidationError) {
        setErrors({ [fieldOf(err)]: plainError(err, { doing: 'save', units: form.units }) });
        setStatus('Nothing was saved: please correct the field marked below.');
      } else setStatus(err instanceof StorageError ? plainError(err, { doing: 'save' }) : `Nothing was saved: ${plainError(err, { doing: 'save' })}`);
    } finally {
      setSaving(false);
    }
  }

  if (!loaded) return <p aria-busy="true">Reading the site…</p>;
  const u = form.units;
  const input = (key: keyof Form, label: string, opts: { hint?: string; decimal?: boolean; required?: boolean } = {}) => (
    <Field id={`site-${key}`} label={label} hint={opts.hint} error={errors[key]}>
      <input
        id={`site-${key}`}
        value={form[key] as string}
        inputMode={opts.decimal ? 'decimal' : undefined}
        autoComplete="off"
        required={opts.required}
        aria-invalid={errors[key] ? true : undefined}
        aria-describedby={describedBy(`site-${key}`, !!opts.hint, !!errors[key])}
        onInput={(e) => set(key, e.currentTarget.value as never)}
      />
    </Field>
  );
  return (
    <form onSubmit={onSave} noValidate>
      <h2 id="screen-title" tabIndex={-1}>{siteId ? 'Edit site' : 'New site'}</h2>
      {status && <p class="callout bad" role="alert">{status}</p>}
      {input('code', 'Site code', { hint: 'the short code the office uses', required: true })}
      {input('name', 'Site name', { required: true })}
      <fieldset>
        <legend>Units shown for this site</legend>
        <label class="choice"><input type="radio" name="units" checked={u === 'metric'} onChange={() => switchUnits('metric')} /> Metric (m, m³/s, km²)</label>
        <label class="choice"><input type="radio" name="units" checked={u === 'us'} onChange={() => switchUnits('us')} /> US customary (ft, ft³/s, mi²)</label>
      </fieldset>
      {input('area', `Catchment area (${displayUnit('area', u)})`, { hint: 'needed for runoff depth and the end of direct runoff', decimal: true })}
      {input('jumpLimit', `Jump limit (${displayUnit('stage', u)})`, { hint: 'a stage change larger than this since the last reading is flagged', decimal: true, required: true })}
      <Field id="site-timeZone" label="Time zone" hint="times at this site are shown and typed in this zone" error={errors.timeZone}>
        <select id="site-timeZone" value={form.timeZone} aria-describedby={describedBy('site-timeZone', true, !!errors.timeZone)} onChange={(e) => set('timeZone', e.currentTarget.value)}>
          {!zones.includes(form.timeZone) && <option value={form.timeZone}>{form.timeZone}</option>}
          {zones.map((z) => <option key={z} value={z}>{z}</option>)}
        </select>
      </Field>
      {input('datumDescription', 'Gauge datum', { hint: 'what the gauge zero is tied to' })}
      {input('datumElevation', `Datum elevation (${displayUnit('stage', u)})`, { decimal: true })}
      {input('lat', 'Latitude (degrees)', { decimal: true })}
      {input('lon', 'Longitude (degrees)', { decimal: true })}
      {'geolocation' in navigator && (
        <button
          type="button"
          class="wide"
          onClick={() =>
            navigator.geolocation.getCurrentPosition(
              (p) => setForm((f) => ({ ...f, lat: p.coords.latitude.toFixed(6), lon: p.coords.longitude.toFixed(6) })),
              (err) => setStatus(locationProblem(err)),
              { enableHighAccuracy: true, timeout: 20_000 },
            )
          }
        >
          Use my location
        </button>
      )}
      <div class="row" style="margin-top:16px">
        <button type="submit" class="primary" disabled={saving}>{saving ? 'Saving…' : 'Save site'}</button>
        <a class="button" href={siteId ? href('sites', siteId) : href('sites')}>Cancel</a>
      </div>
      {siteId && (
        <section class="card" style="margin-top:24px" aria-labelledby="delete-site">
          <h3 id="delete-site">Delete this site</h3>
          {!confirmDelete ? (
            <button type="button" class="danger wide" onClick={() => setConfirmDelete(true)}>Delete site…</button>
          ) : (
            <>
              <p class="callout warn" role="alert">The site will leave the list on this phone and, after the next sync, at the office. Its readings stay stored. Delete it?</p>
              <div class="row">
                <button
                  type="button"
                  class="danger"
                  onClick={async () => {
                    try {
                      await deleteSite(siteId);
                      navigate(href('sites'), true);
                    } catch (err) {
                      setStatus(plainError(err, { doing: 'save' }));
                    }
                  }}
                >
                  Yes, delete
                </button>
                <button type="button" onClick={() => setConfirmDelete(false)}>Keep it</button>
              </div>
            </>
          )}
        </section>
      )}
    </form>
  );
}

