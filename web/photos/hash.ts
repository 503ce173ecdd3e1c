// SHA-256 of photo bytes, as the photo record names them: 64 lower-case hex digits (Web Crypto; the page,
// the photo worker and the service worker alike).

/** SHA-256 of the bytes as 64 lower-case hex digits (Web Crypto). */
export async function sha256Of(bytes: ArrayBuffer): Promise<string> {
  const digest = new Uint8Array(await crypto.subtle.digest('SHA-256', bytes));
  let out = '';
  for (const b of digest) out += b.toString(16).padStart(2, '0');
  return out;
}
