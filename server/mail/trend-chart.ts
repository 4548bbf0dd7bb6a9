import { encodePng } from './png';

/** One month of a trend: the headline estimate and its interval (null when not estimable). */
export interface TrendValue {
  estimate: number;
  ciLow: number;
  ciHigh: number;
}

const WIDTH = 360;
const HEIGHT = 90;
const PAD = 6;
// The app's palette (client/src/styles/index.css) in sRGB, approximated from its oklch values:
// ink-900, accent-500, accent-100, ink-300.
const INK: Rgb = [0x2b, 0x2a, 0x26];
const ACCENT: Rgb = [0x2e, 0x7d, 0x74];
const BAND: Rgb = [0xd5, 0xec, 0xe7];
const RULE: Rgb = [0xbd, 0xbb, 0xb5];
type Rgb = [number, number, number];

/**
 * A small trend chart as PNG bytes: the interval of each month as a shaded band, the estimate as a
 * line with dots, and a grey line at zero (no effect). Text stays out of the image (the e-mail says
 * it beside the image), so no font is needed.
 */
export function trendChartPng(values: ReadonlyArray<TrendValue | null>): Buffer {
  const px = new Uint8Array(WIDTH * HEIGHT * 3).fill(255);
  const known = values.filter((v): v is TrendValue => v !== null);
  if (known.length === 0) return encodePng(WIDTH, HEIGHT, px);
  let lo = Math.min(0, ...known.map((v) => v.ciLow));
  let hi = Math.max(0, ...known.map((v) => v.ciHigh));
  if (hi - lo < 1e-12) [lo, hi] = [lo - 1, hi + 1];
  const yOf = (v: number) => Math.round(PAD + ((hi - v) / (hi - lo)) * (HEIGHT - 2 * PAD));
  const xOf = (i: number) => Math.round(PAD + (values.length === 1 ? 0.5 : i / (values.length - 1)) * (WIDTH - 2 * PAD));
  const set = (x: number, y: number, c: Rgb) => {
    if (x < 0 || y < 0 || x >= WIDTH || y >= HEIGHT) return;
    px.set(c, (y * WIDTH + x) * 3);
  };
  // Interval band, interpolated between neighbouring months.
  for (let i = 0; i + 1 < values.length; i++) {
    const a = values[i];
    const b = values[i + 1];
    if (!a || !b) continue;
    for (let x = xOf(i); x <= xOf(i + 1); x++) {
      const t = (x - xOf(i)) / Math.max(1, xOf(i + 1) - xOf(i));
      const top = yOf(a.ciHigh + t * (b.ciHigh - a.ciHigh));
      const bottom = yOf(a.ciLow + t * (b.ciLow - a.ciLow));
      for (let y = top; y <= bottom; y++) set(x, y, BAND);
    }
  }
  for (let x = PAD; x < WIDTH - PAD; x += 2) set(x, yOf(0), RULE);
  for (let i = 0; i + 1 < values.length; i++) {
    const a = values[i];
    const b = values[i + 1];
    if (a && b) line(xOf(i), yOf(a.estimate), xOf(i + 1), yOf(b.estimate), (x, y) => (set(x, y, ACCENT), set(x, y + 1, ACCENT)));
  }
  values.forEach((v, i) => {
    if (!v) return;
    for (let dx = -2; dx <= 2; dx++) for (let dy = -2; dy <= 2; dy++) set(xOf(i) + dx, yOf(v.estimate) + dy, i === values.length - 1 ? INK : ACCENT);
  });
  return encodePng(WIDTH, HEIGHT, px);
}

/** Bresenham's line. */
function line(x0: number, y0: number, x1: number, y1: number, plot: (x: number, y: number) => void): void {
  const dx = Math.abs(x1 - x0);
  const dy = -Math.abs(y1 - y0);
  const sx = x0 < x1 ? 1 : -1;
  const sy = y0 < y1 ? 1 : -1;
  let err = dx + dy;
  for (;;) {
    plot(x0, y0);
    if (x0 === x1 && y0 === y1) return;
    const e2 = 2 * err;
    if (e2 >= dy) {
      err += dy;
      x0 += sx;
    }
    if (e2 <= dx) {
      err += dx;
      y0 += sy;
    }
  }
}

const BLOCKS = '▁▂▃▄▅▆▇█';

/**
 * A text sparkline of the estimates (plain-text e-mail): one block a month, lowest to highest;
 * a space for a month without an estimate. @example sparkline([1, 2, 3]) // => '▁▅█'
 */
export function sparkline(values: ReadonlyArray<number | null>): string {
  const known = values.filter((v): v is number => v !== null);
  if (known.length === 0) return '';
  const lo = Math.min(...known);
  const hi = Math.max(...known);
  return values.map((v) => (v === null ? ' ' : BLOCKS[hi > lo ? Math.round(((v - lo) / (hi - lo)) * (BLOCKS.length - 1)) : 3])).join('');
}
