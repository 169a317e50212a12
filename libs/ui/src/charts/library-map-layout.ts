import { estimateTextWidth, placeLabels, type PlacedLabel } from '@ohmprint/contracts';
import { linearTicks } from './axis-ticks';
import type { AxisTick, PlotArea } from './chart-types';
import { equalAspectScales, finiteExtent } from './equal-aspect';
import { formatNumber } from './si-format';

/** A lot or the sample placed on the 2-D map (classical MDS coordinates, distance units). */
export interface MapPoint {
  readonly id: string;
  readonly label: string;
  readonly x: number;
  readonly y: number;
  readonly kind: 'reference' | 'sample';
}

export interface LibraryMapLayout {
  readonly width: number;
  readonly height: number;
  readonly area: PlotArea;
  readonly xTicks: readonly AxisTick[];
  readonly yTicks: readonly AxisTick[];
  readonly points: readonly (MapPoint & { readonly px: number; readonly py: number; readonly nearest: boolean })[];
  /** Dashed link from the sample to its nearest lot, when both are on the map. */
  readonly link: { readonly x1: number; readonly y1: number; readonly x2: number; readonly y2: number } | null;
  /** Labels for the sample, the nearest lot and the lots nearest the sample, laid out without overlap. */
  readonly labels: readonly (PlacedLabel & { readonly text: string; readonly kind: 'sample' | 'nearest' | 'lot' })[];
}

/** How many lots get a name on the map besides the nearest one; the table beside it names all. */
export const MAP_LABELLED_LOTS = 6;
const FONT_PX = 11;
const LABEL_HEIGHT = 14;

const MARGIN = { left: 52, right: 16, top: 16, bottom: 36 };

/**
 * Equal axes, since the map is read as distances; the sample is drawn last so it is never hidden
 * under a lot.
 */
export function libraryMapLayout(points: readonly MapPoint[], nearestId: string | null, width: number, height: number): LibraryMapLayout {
  const area: PlotArea = {
    left: MARGIN.left,
    top: MARGIN.top,
    width: width - MARGIN.left - MARGIN.right,
    height: height - MARGIN.top - MARGIN.bottom,
  };
  const { x, y } = equalAspectScales(
    finiteExtent(points.map((p) => p.x)),
    finiteExtent(points.map((p) => p.y)),
    area,
    0.12,
  );
  const placed = [...points]
    .sort((a, b) => (a.kind === b.kind ? 0 : a.kind === 'sample' ? 1 : -1))
    .map((p) => ({ ...p, px: x(p.x), py: y(p.y), nearest: p.id === nearestId }));
  const sample = placed.find((p) => p.kind === 'sample');
  const nearest = placed.find((p) => p.nearest);
  // Name the sample, its nearest lot, then the lots closest to the sample on the map (or to the
  // middle when there is no sample), in that order of importance.
  const cx = sample?.px ?? area.left + area.width / 2;
  const cy = sample?.py ?? area.top + area.height / 2;
  const others = placed
    .filter((p) => p.kind === 'reference' && !p.nearest && Number.isFinite(p.px) && Number.isFinite(p.py))
    .sort((a, b) => Math.hypot(a.px - cx, a.py - cy) - Math.hypot(b.px - cx, b.py - cy))
    .slice(0, MAP_LABELLED_LOTS);
  const wanted = [
    ...(sample ? [{ p: sample, text: sample.label, kind: 'sample' as const, offset: 10 }] : []),
    ...(nearest ? [{ p: nearest, text: `${nearest.label} (nearest)`, kind: 'nearest' as const, offset: 8 }] : []),
    ...others.map((p) => ({ p, text: p.label, kind: 'lot' as const, offset: 6 })),
  ];
  const boxes = placeLabels(
    wanted.map((w) => ({
      id: w.p.id,
      anchor: { x: w.p.px, y: w.p.py },
      width: estimateTextWidth(w.text, FONT_PX, w.kind !== 'lot'),
      height: LABEL_HEIGHT,
      offset: w.offset,
      sides: ['above-right', 'above-left', 'below-right', 'below-left', 'right', 'left', 'above', 'below'],
    })),
    { x: area.left, y: area.top, width: area.width, height: area.height },
    // Markers: a label never hides a lot or the sample while there is room elsewhere.
    { gap: 2, obstacles: placed.map((p) => ({ x: p.px - 6, y: p.py - 6, width: 12, height: 12 })) },
  );
  const labels = boxes.map((b, i) => ({ ...b, text: wanted[i].text, kind: wanted[i].kind }));
  return {
    width,
    height,
    area,
    xTicks: linearTicks(x, 5, (v) => formatNumber(v, 3)),
    yTicks: linearTicks(y, 5, (v) => formatNumber(v, 3)),
    points: placed,
    link: sample && nearest ? { x1: sample.px, y1: sample.py, x2: nearest.px, y2: nearest.py } : null,
    labels,
  };
}
