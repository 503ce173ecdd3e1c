// A photo's bytes for showing it: from this phone when held, else fetched from the office by GET
// {base}/blobs/sha256-<hex> (a photo that came by pull), checked against its hash and kept on this phone.
// Offline, or with no office set up, the photo is "not on this phone yet".
import { PHOTO_TYPES, type PhotoType } from '../../core/index';
import { getPhotoBytes, putPhotoBytes } from '../db/photo-bytes';
import { getSyncValue } from '../db/sync-store';
import { sha256Of } from '../photos/hash';
import { send } from './http';
import { blobUrl } from './photo-delivery';

/** A photo's bytes, or why they cannot be shown yet (a sentence for the screen). */
export type PhotoBlob = { kind: 'here'; blob: Blob } | { kind: 'missing'; message: string };

const NOT_YET = 'This photo is not on this phone yet.';

/** The bytes named `sha256`: held here, or fetched from the office and kept. */
export async function photoBlob(sha256: string): Promise<PhotoBlob> {
  const held = await getPhotoBytes(sha256);
  if (held) return { kind: 'here', blob: held.blob };
  const settings = await getSyncValue('settings');
  if (!settings) return { kind: 'missing', message: `${NOT_YET} It comes from the office once this phone is set up to sync.` };
  const res = await send(blobUrl(settings, sha256), { method: 'GET', headers: { Authorization: `Bearer ${settings.token}` } });
  if (!res) return { kind: 'missing', message: `${NOT_YET} It loads from the office when the network is back.` };
  if (res.status === 404) return { kind: 'missing', message: `${NOT_YET} The office does not have it yet: the phone that took it has not sent it. Try again later.` };
  if (res.status === 401 || res.status === 403) return { kind: 'missing', message: `${NOT_YET} The office did not accept this phone’s token; check it on the Sync screen.` };
  if (res.status !== 200) return { kind: 'missing', message: `${NOT_YET} The office could not send it just now (${res.status}). Try again later.` };
  const type = (res.headers.get('Content-Type') ?? '').split(';')[0].trim().toLowerCase();
  let bytes: ArrayBuffer;
  try {
    bytes = await res.arrayBuffer();
  } catch {
    return { kind: 'missing', message: `${NOT_YET} The download broke off. Try again.` };
  }
  if (!(PHOTO_TYPES as readonly string[]).includes(type) || (await sha256Of(bytes)) !== sha256) {
    return { kind: 'missing', message: `${NOT_YET} What came from the office was not this photo (damaged on the way). Try again.` };
  }
  const blob = new Blob([bytes], { type });
  // The office holds them (it just sent them): kept as confirmed, so this phone never uploads them.
  // A full phone still shows the photo; it is fetched again next time.
  await putPhotoBytes(sha256, type as PhotoType, blob, { confirmed: true }).catch(() => undefined);
  return { kind: 'here', blob };
}
