/**
 * How the n-th series is drawn. Colour comes from the theme's tokens and every series also
 * differs by dash and marker, so replicates stay apart in greyscale and for colour-blind readers.
 */
export interface SeriesStyle {
  readonly stroke: string;
  readonly dash: string;
  readonly marker: 'circle' | 'square' | 'triangle' | 'diamond' | 'none';
}

/** A fitted model's curve: a dashed line in the error colour, apart from the measured points it runs through. */
export const FIT_STYLE: SeriesStyle = { stroke: 'var(--mat-sys-error)', dash: '5 3', marker: 'none' };

/** The style of series `index` of `series`: a fit gets FIT_STYLE, data the n-th data style. */
export function styleFor(series: readonly { readonly role?: 'data' | 'fit' }[], index: number): SeriesStyle {
  if (series[index].role === 'fit') return FIT_STYLE;
  return seriesStyle(series.slice(0, index).filter((s) => s.role !== 'fit').length);
}

const STYLES: readonly SeriesStyle[] = [
  { stroke: 'var(--mat-sys-primary)', dash: '', marker: 'circle' },
  { stroke: 'var(--mat-sys-tertiary)', dash: '6 3', marker: 'square' },
  { stroke: 'var(--mat-sys-secondary)', dash: '2 3', marker: 'triangle' },
  { stroke: 'var(--mat-sys-on-surface-variant)', dash: '8 3 2 3', marker: 'diamond' },
];

export function seriesStyle(index: number): SeriesStyle {
  return STYLES[index % STYLES.length];
}

/** A marker shape centred on (x, y) as an SVG path, `r` its half-size. */
export function markerPath(shape: SeriesStyle['marker'], x: number, y: number, r = 3): string {
  switch (shape) {
    case 'none':
      return '';
    case 'circle':
      return `M${x - r},${y}a${r},${r} 0 1,0 ${2 * r},0a${r},${r} 0 1,0 ${-2 * r},0Z`;
    case 'square':
      return `M${x - r},${y - r}h${2 * r}v${2 * r}h${-2 * r}Z`;
    case 'triangle':
      return `M${x},${y - r}L${x + r},${y + r}L${x - r},${y + r}Z`;
    case 'diamond':
      return `M${x},${y - r}L${x + r},${y}L${x},${y + r}L${x - r},${y}Z`;
  }
}
