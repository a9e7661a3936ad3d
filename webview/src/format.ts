// Number formatting for the panel: few digits, grouped thousands, a real minus sign, and a dash
// where a measure has no value. One place so that the strip, the table and the report agree.

export const NO_VALUE = '—';
const MINUS = '\u2212';

function withMinus(text: string): string {
  return text.startsWith('-') ? MINUS + text.slice(1) : text;
}

/** Integers with thousands separators: 12,345. */
export function formatCount(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  return withMinus(Math.round(value).toLocaleString('en-US'));
}

/** About three significant digits without exponents in the usual range. */
export function formatNumber(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  if (value === 0) return '0';
  const abs = Math.abs(value);
  let text: string;
  if (abs >= 100) text = Math.round(value).toLocaleString('en-US');
  else if (abs >= 10) text = value.toFixed(1);
  else if (abs >= 1) text = value.toFixed(2);
  else if (abs >= 0.001) text = value.toFixed(3 - Math.floor(Math.log10(abs)) - 1);
  else text = value.toExponential(1);
  return withMinus(text);
}

/** A fraction as a percentage: 23.4%, 0.42%, 0.0031%. */
export function formatShare(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  const pct = value * 100;
  if (pct === 0) return '0%';
  const abs = Math.abs(pct);
  let text: string;
  if (abs >= 10) text = pct.toFixed(1);
  else if (abs >= 1) text = pct.toFixed(2);
  else text = formatNumber(pct);
  return `${withMinus(text)}%`;
}

/** A ratio such as neighbour lift, two decimals below 10: 0.42×, 2.31×, 14.2×. */
export function formatRatio(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  return `${Math.abs(value) < 10 ? formatFixed(value, 2) : formatNumber(value)}×`;
}

/** Fixed decimals (idf, spread). */
export function formatFixed(value: number | null | undefined, decimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  return withMinus(value.toFixed(decimals));
}

/** Bytes as KB/MB/GB with one decimal. */
export function formatBytes(value: number): string {
  if (!Number.isFinite(value)) return NO_VALUE;
  const units = ['bytes', 'KB', 'MB', 'GB', 'TB'];
  let v = value;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) {
    v /= 1024;
    u += 1;
  }
  return u === 0 ? `${formatCount(v)} bytes` : `${v.toFixed(1)} ${units[u]}`;
}

/** Axis ticks: a share as a percentage without trailing zeros (35%, 0.1%, 12.5%). */
export function formatAxisShare(value: number): string {
  if (!Number.isFinite(value)) return '';
  return `${withMinus(String(Number((value * 100).toPrecision(3))))}%`;
}
