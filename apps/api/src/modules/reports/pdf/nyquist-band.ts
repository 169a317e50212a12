import type { ReportPlots } from './report-data';

type Point = [number, number];
type Envelope = NonNullable<ReportPlots['referenceEnvelope']>;

/**
 * The reference band of the Nyquist plot in data units (Z′, −Z″), drawn as the web page draws it:
 * at each frequency the box [Z′ low, Z′ high] × [−Z″ high, −Z″ low] of the reference lots, each
 * pair of neighbouring boxes joined by its convex hull so the band stays continuous. Reports
 * issued before Z′/Z″ spreads were stored have only |Z| and phase ranges: their boxes are the
 * corners of each frequency's polar sector, which the hulls join the same way.
 */
export function nyquistBandPolygons(env: Envelope): Point[][] {
  const n = env.frequencyHz.length;
  const boxes: Point[][] = [];
  for (let i = 0; i < n; i++) {
    let corners: Point[];
    if (env.reMin && env.reMax && env.imMin && env.imMax) {
      const [r0, r1, y0, y1] = [env.reMin[i], env.reMax[i], -env.imMax[i], -env.imMin[i]];
      corners = [[r0, y0], [r1, y0], [r1, y1], [r0, y1]];
    } else {
      corners = [];
      for (const m of [env.modulusMin[i], env.modulusMax[i]]) {
        for (const deg of [env.phaseMinDeg[i], env.phaseMaxDeg[i]]) {
          const rad = (deg * Math.PI) / 180;
          corners.push([m * Math.cos(rad), -m * Math.sin(rad)]);
        }
      }
    }
    if (corners.every(([x, y]) => Number.isFinite(x) && Number.isFinite(y))) boxes.push(corners);
  }
  if (boxes.length === 1) return [convexHull(boxes[0])];
  return boxes.slice(1).map((b, i) => convexHull([...boxes[i], ...b]));
}

/** Andrew's monotone chain (counter-clockwise in a y-up frame), collinear points dropped. */
export function convexHull(points: readonly Point[]): Point[] {
  const p = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (p.length < 3) return p;
  const cross = (o: Point, a: Point, b: Point) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: Point[] = [];
  for (const q of p) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], q) <= 0) lower.pop();
    lower.push(q);
  }
  const upper: Point[] = [];
  for (const q of [...p].reverse()) {
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], q) <= 0) upper.pop();
    upper.push(q);
  }
  return [...lower.slice(0, -1), ...upper.slice(0, -1)];
}
