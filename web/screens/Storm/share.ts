// Sharing a storm: the plot with its figures as a PNG picture, and the separated series as CSV. The phone's
// share sheet is used where it takes files (Web Share level 2), a download otherwise.
import { csvDocument, displayUnit, toDisplay, toIsoWithOffset, type UnitSystem } from '../../../core';

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

/** The separated series as CSV rows: time with the site's offset, stage, discharge, baseflow and direct runoff. */
export function separatedCsv(
  series: { time_ms: ArrayLike<number>; stage_m: ArrayLike<number>; discharge_m3s: ArrayLike<number>; extrapolated: ArrayLike<number> },
  baseflow_m3s: ArrayLike<number>,
  meta: { siteCode: string; timeZone: string; units: UnitSystem; method: string },
): string {
  const { units, timeZone } = meta;
  const s = displayUnit('stage', units);
  const q = displayUnit('discharge', units);
  const rows: string[][] = [['site', 'time', `stage_${s}`, `discharge_${q}`, `baseflow_${q}`, `direct_runoff_${q}`, 'extrapolated', 'method']];
  const qs = (v: number) => String(Number(toDisplay('discharge', v, units).toPrecision(6)));
  for (let i = 0; i < series.time_ms.length; i++) {
    const Q = series.discharge_m3s[i];
    const b = baseflow_m3s[i];
    rows.push([
      meta.siteCode,
      toIsoWithOffset(series.time_ms[i], timeZone),
      toDisplay('stage', series.stage_m[i], units).toFixed(units === 'us' ? 3 : 4),
      qs(Q),
      qs(b),
      qs(Math.max(0, Q - b)),
      series.extrapolated[i] ? 'yes' : 'no',
      meta.method,
    ]);
  }
  return csvDocument(rows);
}
