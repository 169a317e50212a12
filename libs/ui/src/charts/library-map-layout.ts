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
}

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
  return {
    width,
    height,
    area,
    xTicks: linearTicks(x, 5, (v) => formatNumber(v, 3)),
    yTicks: linearTicks(y, 5, (v) => formatNumber(v, 3)),
    points: placed,
    link: sample && nearest ? { x1: sample.px, y1: sample.py, x2: nearest.px, y2: nearest.py } : null,
  };
}
