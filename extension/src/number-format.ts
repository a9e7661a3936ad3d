// How numbers are written for a reader, in the panel, the HTML report and the CLI alike: few
// digits, grouped thousands, a real minus sign, and a dash where there is no value. Pure: no Node
// and no DOM, so both bundles import it.

export const NO_VALUE = '—';
const MINUS = '\u2212';

export function withMinus(text: string): string {
  return text.startsWith('-') ? MINUS + text.slice(1) : text;
}

/** A change with its sign always written and a real minus: +0.012, −0.003. */
export function formatSignedChange(value: number, digits: number): string {
  return `${value >= 0 ? '+' : MINUS}${Math.abs(value).toFixed(digits)}`;
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
