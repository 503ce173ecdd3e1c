// Bundle files: made for the share sheet (where the browser accepts the file) or a download, and read back
// with every check of the format before anything is shown or stored.
import { BundleError, bundleFileParts, bundleJson, type BlobBytes, type Bundle } from '../../core';
import { downloadFile } from '../save-file';

/** Largest bundle file read, bytes (about a year of 5-minute logger readings at several sites). */
export const MAX_FILE_BYTES = 200 * 1024 * 1024;

/** The file name of a bundle: freshet-<device, 8 chars>-<yyyymmdd-hhmm UTC>[-changes].json. */
export function bundleFileName(bundle: Bundle, changesOnly: boolean): string {
  const stamp = bundle.created.slice(0, 16).replace(/[-:]/g, '').replace('T', '-');
  const device = bundle.device.replace(/[^\w-]+/g, '').slice(0, 8) || 'device';
  return `freshet-${device}-${stamp}${changesOnly ? '-changes' : ''}.json`;
}

/**
 * The same bundle as files the share sheet may take, best first: JSON, then plain text (Chromium's share
 * sheet takes only a fixed list of types, and JSON is not on it; text is, and the content is the same).
 */
export function shareCandidates(bundle: Bundle, name: string): File[] {
  const json = JSON.stringify(bundle);
  return [new File([json], name, { type: 'application/json' }), new File([json], name.replace(/\.json$/, '.json.txt'), { type: 'text/plain' })];
}

/** How a file left the app: through the share sheet, as a download, or not at all (the user closed the sheet). */
export type FileOutcome = { kind: 'shared'; name: string } | { kind: 'downloaded'; name: string } | { kind: 'cancelled' };

/** Offers the bundle to the share sheet when `share` and the browser accepts a candidate file; else downloads it. */
export async function shareOrDownload(bundle: Bundle, changesOnly: boolean, share: boolean): Promise<FileOutcome> {
  const name = bundleFileName(bundle, changesOnly);
  if (share && typeof navigator.canShare === 'function') {
    const file = shareCandidates(bundle, name).find((f) => navigator.canShare({ files: [f] }));
    if (file) {
      try {
        await navigator.share({ files: [file], title: file.name });
        return { kind: 'shared', name: file.name };
      } catch (e) {
        if ((e as Error).name === 'AbortError') return { kind: 'cancelled' };
        // Share refused for another reason (no gesture, policy): fall back to a download.
      }
    }
  }
  downloadFile(new File([JSON.stringify(bundle)], name, { type: 'application/json' }));
  return { kind: 'downloaded', name };
}

/** Reads and checks a bundle file and the photo bytes it carries; throws a BundleError (or BundleBlobError) saying what is wrong. */
export async function readBundleFile(file: Blob): Promise<{ bundle: Bundle; blobs: Map<string, BlobBytes> }> {
  if (file.size > MAX_FILE_BYTES) {
    throw new BundleError('shape', `This file is ${Math.round(file.size / 1024 / 1024)} MiB; bundle files up to ${MAX_FILE_BYTES / 1024 / 1024} MiB can be read.`);
  }
  let parsed: unknown;
  try {
    parsed = bundleJson(await file.text());
  } catch {
    throw new BundleError('shape', 'This file is not a Freshet bundle: it is not JSON text. Choose a file the app saved as a bundle.');
  }
  return bundleFileParts(parsed);
}
