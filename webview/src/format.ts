// Number formatting for the panel: few digits, grouped thousands, a real minus sign, and a dash
// where a measure has no value. One place so that the strip, the table and the report agree.

import { formatCount, formatNumber, NO_VALUE, withMinus } from '../../extension/src/number-format';

// The measure formats are shared with the CLI (extension/src/number-format.ts); the rest are the panel's own.
export { formatCount, formatNumber, formatShare, NO_VALUE } from '../../extension/src/number-format';

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
