// An object URL for a photo's bytes while a component shows it, revoked when it stops: the bytes from
// this phone, or fetched from the office for a photo that came by pull (web/sync/photo-fetch.ts).
import { useEffect, useState } from 'preact/hooks';
import { photoBlob } from '../../sync/photo-fetch';

/** A photo's picture: loading, its URL, or why it cannot be shown (a sentence). */
export type PhotoUrl = { state: 'loading' } | { state: 'here'; url: string } | { state: 'missing'; message: string };

/** An object URL for a Blob, revoked when the component stops showing it. */
export function useBlobUrl(blob: Blob | undefined): string | undefined {
  const [url, setUrl] = useState<string>();
  useEffect(() => {
    if (!blob) return undefined;
    const u = URL.createObjectURL(blob);
    setUrl(u);
    return () => URL.revokeObjectURL(u);
  }, [blob]);
  return url;
}

/** The picture of the bytes named `sha256`; `attempt` asks again (after "Try again"). */
export function usePhotoUrl(sha256: string, attempt = 0): PhotoUrl {
  const [state, setState] = useState<PhotoUrl>({ state: 'loading' });
  useEffect(() => {
    let live = true;
    let url: string | undefined;
    setState({ state: 'loading' });
    photoBlob(sha256).then(
      (r) => {
        if (!live) return;
        if (r.kind === 'missing') return setState({ state: 'missing', message: r.message });
        url = URL.createObjectURL(r.blob);
        setState({ state: 'here', url });
      },
      () => live && setState({ state: 'missing', message: 'This photo could not be read on this phone just now. Try again.' }),
    );
    return () => {
      live = false;
      if (url) URL.revokeObjectURL(url);
    };
  }, [sha256, attempt]);
  return state;
}
