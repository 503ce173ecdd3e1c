// Hands a file to the user: the phone's share sheet when asked and offered, else a download. The one
// download of the page (exports, the rating table, bundle files).

/** What became of the file: shared, downloaded, or not shared (with the browser's reason). */
export type SaveOutcome = { ok: true; how: 'shared' | 'downloaded' } | { ok: false; reason: string };

/** Shares (when `share` and the browser can share files) or downloads text as a file named `name`. */
export async function saveTextFile(text: string, name: string, type: string, share: boolean): Promise<SaveOutcome> {
  const file = new File([text], name, { type });
  if (share && navigator.canShare?.({ files: [file] })) {
    try {
      await navigator.share({ files: [file], title: name });
      return { ok: true, how: 'shared' };
    } catch (err) {
      // The user closing the share sheet is an AbortError: not a failure worth the browser's wording.
      return { ok: false, reason: (err as Error).name === 'AbortError' ? 'the share was cancelled' : 'this phone could not share the file' };
    }
  }
  downloadFile(file);
  return { ok: true, how: 'downloaded' };
}

/** Downloads `file` under its own name. */
export function downloadFile(file: File): void {
  const url = URL.createObjectURL(file);
  const a = document.createElement('a');
  a.href = url;
  a.download = file.name;
  a.click();
  // Give the browser time to start the download before the address is dropped.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
