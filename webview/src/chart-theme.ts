// Chart colours and fonts come from CSS custom properties (panel.css maps them to VS Code's
// theme variables with plain-browser fallbacks), so charts follow the editor theme and the
// light/dark preference of a standalone report.

export interface ChartTheme {
  foreground: string;
  muted: string;
  grid: string;
  baseline: string;
  current: string;
  suggested: string;
  other: string;
  fontFamily: string;
  fontSize: number;
}

export function readChartTheme(root: Element = document.body): ChartTheme {
  const style = getComputedStyle(root);
  const v = (name: string, fallback: string): string => style.getPropertyValue(name).trim() || fallback;
  return {
    foreground: v('--lw-fg', '#333333'),
    muted: v('--lw-muted', '#6b6b6b'),
    grid: v('--lw-chart-grid', 'rgba(128,128,128,0.25)'),
    baseline: v('--lw-series-baseline', '#3a6fd8'),
    current: v('--lw-series-current', '#d9822b'),
    suggested: v('--lw-series-suggested', '#c23b3b'),
    other: v('--lw-series-other', '#808080'),
    fontFamily: v('--lw-font', 'system-ui, sans-serif'),
    fontSize: Number.parseFloat(v('--lw-chart-font-size', '11')) || 11,
  };
}

let probe: CanvasRenderingContext2D | null | undefined;

/** Any CSS colour with the given opacity, normalised through a canvas context. */
export function withAlpha(color: string, alpha: number): string {
  if (probe === undefined) probe = document.createElement('canvas').getContext('2d');
  if (!probe) return color;
  probe.fillStyle = '#000000';
  probe.fillStyle = color;
  const normal = String(probe.fillStyle);
  const hex = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(normal);
  if (hex) return `rgba(${parseInt(hex[1]!, 16)}, ${parseInt(hex[2]!, 16)}, ${parseInt(hex[3]!, 16)}, ${alpha})`;
  const rgba = /^rgba?\(([^,]+),([^,]+),([^,)]+)/i.exec(normal);
  if (rgba) return `rgba(${rgba[1]!.trim()}, ${rgba[2]!.trim()}, ${rgba[3]!.trim()}, ${alpha})`;
  return normal;
}

/** Calls `onChange` when the editor theme (body class) or the OS colour scheme changes. */
export function watchTheme(onChange: () => void): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const fire = (): void => {
    clearTimeout(timer);
    timer = setTimeout(onChange, 50);
  };
  const observer = new MutationObserver(fire);
  observer.observe(document.body, { attributes: true, attributeFilter: ['class', 'data-vscode-theme-kind'] });
  observer.observe(document.documentElement, { attributes: true, attributeFilter: ['style', 'class'] });
  const media = window.matchMedia('(prefers-color-scheme: dark)');
  media.addEventListener('change', fire);
  return () => {
    observer.disconnect();
    media.removeEventListener('change', fire);
    clearTimeout(timer);
  };
}
