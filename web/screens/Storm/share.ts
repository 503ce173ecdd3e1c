// Sharing a storm: the plot with its figures as a PNG picture and files such as the separated series. The
// phone's share sheet is used where it takes files (Web Share level 2), a download otherwise.

/** Hands a file to the phone's share sheet when it takes files, else downloads it; says which happened. */
export async function shareOrDownload(file: File): Promise<'shared' | 'downloaded' | 'cancelled'> {
  const nav = navigator as Navigator & { canShare?: (data: ShareData) => boolean };
  if (typeof nav.share === 'function' && nav.canShare?.({ files: [file] })) {
    try {
      await nav.share({ files: [file], title: file.name });
      return 'shared';
    } catch (e) {
      // The user closed the share sheet: nothing to do.
      if (e instanceof DOMException && e.name === 'AbortError') return 'cancelled';
      throw e;
    }
  }
  const url = URL.createObjectURL(file);
  try {
    const a = document.createElement('a');
    a.href = url;
    a.download = file.name;
    document.body.append(a);
    a.click();
    a.remove();
  } finally {
    // Give the browser time to start the download before the address is dropped.
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
  }
  return 'downloaded';
}

/** The picture: a white card with the title and figure lines (CSS px font) above the plot's canvas. */
export function composePicture(plot: HTMLCanvasElement, title: string, lines: readonly string[], ratio: number): HTMLCanvasElement {
  const pad = 12 * ratio;
  const lineH = 18 * ratio;
  const head = pad + 22 * ratio + lines.length * lineH + pad / 2;
  const out = document.createElement('canvas');
  out.width = plot.width + 2 * pad;
  out.height = head + plot.height + pad;
  const ctx = out.getContext('2d')!;
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, out.width, out.height);
  ctx.fillStyle = '#15191c';
  ctx.textBaseline = 'top';
  ctx.font = `700 ${16 * ratio}px system-ui, sans-serif`;
  ctx.fillText(title, pad, pad);
  ctx.font = `${13 * ratio}px system-ui, sans-serif`;
  lines.forEach((l, k) => ctx.fillText(l, pad, pad + 22 * ratio + k * lineH));
  ctx.drawImage(plot, pad, head);
  return out;
}

/** A canvas as a PNG file. */
export function canvasToPng(canvas: HTMLCanvasElement, name: string): Promise<File> {
  return new Promise((done, fail) =>
    canvas.toBlob((blob) => (blob ? done(new File([blob], name, { type: 'image/png' })) : fail(new Error('The picture could not be made.'))), 'image/png'),
  );
}
