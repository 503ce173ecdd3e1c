// Sharing a storm: the plot with its figures as a PNG picture and files such as the separated series. The
// phone's share sheet is used where it takes files (Web Share level 2), a download otherwise.
import { wrapText } from './picture-layout';

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

/**
 * The picture: a white card with the title and figure lines (CSS px fonts × ratio) above the plot's
 * canvas, as wide as the plot plus its margins. Text is wrapped to that width (never cut at the edge),
 * and the card grows as tall as the wrapped text needs.
 */
export function composePicture(plot: HTMLCanvasElement, title: string, lines: readonly string[], ratio: number): HTMLCanvasElement {
  const pad = 12 * ratio;
  const titleFont = `700 ${16 * ratio}px system-ui, sans-serif`;
  const lineFont = `${13 * ratio}px system-ui, sans-serif`;
  const titleH = 21 * ratio;
  const lineH = 18 * ratio;
  const out = document.createElement('canvas');
  out.width = plot.width + 2 * pad;
  const ctx = out.getContext('2d')!;
  const max = out.width - 2 * pad;
  const wrapped = (font: string, texts: readonly string[]) => {
    ctx.font = font;
    return texts.flatMap((t) => wrapText(t, max, (x) => ctx.measureText(x).width));
  };
  const titleLines = wrapped(titleFont, [title]);
  const figureLines = wrapped(lineFont, lines);
  const head = pad + titleLines.length * titleH + ratio + figureLines.length * lineH + pad / 2;
  // Setting the height clears the canvas and its state, so everything is drawn after it.
  out.height = Math.ceil(head + plot.height + pad);
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, out.width, out.height);
  ctx.fillStyle = '#15191c';
  ctx.textBaseline = 'top';
  ctx.font = titleFont;
  titleLines.forEach((l, k) => ctx.fillText(l, pad, pad + k * titleH));
  ctx.font = lineFont;
  const below = pad + titleLines.length * titleH + ratio;
  figureLines.forEach((l, k) => ctx.fillText(l, pad, below + k * lineH));
  ctx.drawImage(plot, pad, head);
  return out;
}

/** A canvas as a PNG file. */
export function canvasToPng(canvas: HTMLCanvasElement, name: string): Promise<File> {
  return new Promise((done, fail) =>
    canvas.toBlob((blob) => (blob ? done(new File([blob], name, { type: 'image/png' })) : fail(new Error('The picture could not be made.'))), 'image/png'),
  );
}
