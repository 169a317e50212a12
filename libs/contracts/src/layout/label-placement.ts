/**
 * Chart label placement shared by the portals' SVG charts and the PDF report, so a label never
 * covers another label and never runs off the plot, on screen and on paper alike.
 *
 * Pure geometry: the caller measures its text (pdfkit's `widthOfString`, or `estimateTextWidth`
 * below on screen) and draws the boxes this returns. Coordinates are in the caller's units with y
 * growing downwards (SVG and pdfkit both do).
 *
 * Strategy (greedy, in the order the labels are given, so put the most important first):
 *  1. the label's preferred sides around its anchor (right, left, above, … as asked);
 *  2. the same sides shifted up and down in steps of one label height ("stacked"), with a leader
 *     line back to the anchor once the box no longer touches it;
 *  3. an exhaustive search over the positions where a box can rest against the bounds or another
 *     box, taking the free one nearest the anchor (complete: if any free position exists, one of
 *     these is free);
 *  4. only when the bounds are truly full the label is returned with `placed: false`, for the
 *     caller to list elsewhere (a key or the chart's data table). It never overlaps or clips.
 */

export interface LabelRect {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export type LabelSide = 'right' | 'left' | 'above' | 'below' | 'above-right' | 'above-left' | 'below-right' | 'below-left';

export interface LabelRequest {
  readonly id: string;
  /** The point the label names (a marker's centre, the top of a vertical line). */
  readonly anchor: { readonly x: number; readonly y: number };
  readonly width: number;
  readonly height: number;
  /** Sides to try first, best first. Default: right, left, above, below, then the diagonals. */
  readonly sides?: readonly LabelSide[];
  /** Distance from the anchor to the box on its preferred sides (clear of a marker's radius). Default: the gap. */
  readonly offset?: number;
}

export interface PlacedLabel extends LabelRect {
  readonly id: string;
  /** False only when no free room was left inside the bounds; the box is then not to be drawn. */
  readonly placed: boolean;
  /** The side used, or 'moved' when the exhaustive search put it elsewhere. */
  readonly side: LabelSide | 'moved';
  /** From the anchor to the box's nearest edge point, when the box was moved away from its anchor. */
  readonly leader: { readonly x1: number; readonly y1: number; readonly x2: number; readonly y2: number } | null;
}

export interface LabelPlacementOptions {
  /** Space between the anchor and the box, and kept between boxes. Default 3. */
  readonly gap?: number;
  /** Regions labels should not cover (markers, the sample's line); honoured unless no room is left. */
  readonly obstacles?: readonly LabelRect[];
  /** How many label heights a stacked label may move up or down before the exhaustive search. Default 6. */
  readonly maxStack?: number;
}

const DEFAULT_SIDES: readonly LabelSide[] = ['right', 'left', 'above', 'below', 'above-right', 'above-left', 'below-right', 'below-left'];
const EPS = 1e-9;

/** True when two boxes share interior area (touching edges is not overlapping). */
export function rectsOverlap(a: LabelRect, b: LabelRect): boolean {
  return a.x < b.x + b.width - EPS && b.x < a.x + a.width - EPS && a.y < b.y + b.height - EPS && b.y < a.y + a.height - EPS;
}

/** True when `inner` lies wholly inside `outer`. */
export function rectInside(inner: LabelRect, outer: LabelRect): boolean {
  return (
    inner.x >= outer.x - EPS &&
    inner.y >= outer.y - EPS &&
    inner.x + inner.width <= outer.x + outer.width + EPS &&
    inner.y + inner.height <= outer.y + outer.height + EPS
  );
}

/**
 * A width for text in a proportional sans-serif (Inter) without measuring it: 0.6 em per
 * character errs wide (Inter's digits are about 0.57 em; common practice for SVG without a DOM),
 * so a box is never narrower than its text.
 */
export function estimateTextWidth(text: string, fontSize: number, bold = false): number {
  return [...text].length * fontSize * (bold ? 0.64 : 0.6);
}

function sideBox(side: LabelSide, ax: number, ay: number, w: number, h: number, gap: number): { x: number; y: number } {
  switch (side) {
    case 'right':
      return { x: ax + gap, y: ay - h / 2 };
    case 'left':
      return { x: ax - gap - w, y: ay - h / 2 };
    case 'above':
      return { x: ax - w / 2, y: ay - gap - h };
    case 'below':
      return { x: ax - w / 2, y: ay + gap };
    case 'above-right':
      return { x: ax + gap, y: ay - gap - h };
    case 'above-left':
      return { x: ax - gap - w, y: ay - gap - h };
    case 'below-right':
      return { x: ax + gap, y: ay + gap };
    case 'below-left':
      return { x: ax - gap - w, y: ay + gap };
  }
}

/** The point of `r` nearest to (px, py). */
function nearestPoint(r: LabelRect, px: number, py: number): { x: number; y: number } {
  return { x: Math.min(Math.max(px, r.x), r.x + r.width), y: Math.min(Math.max(py, r.y), r.y + r.height) };
}

function distanceTo(r: LabelRect, px: number, py: number): number {
  const p = nearestPoint(r, px, py);
  return Math.hypot(p.x - px, p.y - py);
}

/**
 * Places every label inside `bounds` so that no two placed boxes overlap (they keep `gap` apart
 * where room allows). Returns the labels in the order given.
 */
export function placeLabels(labels: readonly LabelRequest[], bounds: LabelRect, options: LabelPlacementOptions = {}): PlacedLabel[] {
  const gap = options.gap ?? 3;
  const maxStack = options.maxStack ?? 6;
  const obstacles = (options.obstacles ?? []).filter((o) => [o.x, o.y, o.width, o.height].every(Number.isFinite));
  const taken: LabelRect[] = [];
  const out: PlacedLabel[] = [];

  // Boxes keep half the gap around them, so two neighbours end up a whole gap apart.
  const padded = (r: LabelRect, pad: number): LabelRect => ({ x: r.x - pad, y: r.y - pad, width: r.width + 2 * pad, height: r.height + 2 * pad });
  const fits = (r: LabelRect, pad: number, avoidObstacles: boolean): boolean =>
    rectInside(r, bounds) &&
    !taken.some((t) => rectsOverlap(padded(r, pad), padded(t, pad))) &&
    (!avoidObstacles || !obstacles.some((o) => rectsOverlap(r, o)));

  for (const label of labels) {
    const w = Math.max(0, label.width);
    const h = Math.max(0, label.height);
    const ax = label.anchor.x;
    const ay = label.anchor.y;
    const finite = [w, h, ax, ay].every(Number.isFinite);
    if (!finite || w > bounds.width + EPS || h > bounds.height + EPS) {
      out.push({ id: label.id, x: Number.isFinite(ax) ? ax : bounds.x, y: Number.isFinite(ay) ? ay : bounds.y, width: w, height: h, placed: false, side: 'moved', leader: null });
      continue;
    }
    const sides = label.sides && label.sides.length > 0 ? label.sides : DEFAULT_SIDES;
    const offset = Number.isFinite(label.offset) ? Math.max(0, label.offset!) : gap;
    let chosen: { r: LabelRect; side: LabelSide | 'moved' } | null = null;

    // 1 and 2: preferred sides, then the same sides stacked up or down by whole label heights.
    outer: for (let step = 0; step <= maxStack; step++) {
      const shifts = step === 0 ? [0] : [step, -step];
      for (const shift of shifts) {
        for (const side of sides) {
          const p = sideBox(side, ax, ay, w, h, offset);
          const r = { x: p.x, y: p.y + shift * (h + gap), width: w, height: h };
          if (fits(r, gap / 2, true)) {
            chosen = { r, side };
            break outer;
          }
        }
      }
    }

    // 3: exhaustive — every box resting against a bound or a placed box's edge, nearest first.
    if (!chosen) {
      for (const avoid of [true, false]) {
        for (const pad of [gap / 2, 0]) {
          const r = nearestFree(ax, ay, w, h, offset, bounds, taken, avoid ? obstacles : [], pad, fits, avoid);
          if (r) {
            chosen = { r, side: 'moved' };
            break;
          }
        }
        if (chosen) break;
      }
    }

    if (!chosen) {
      out.push({ id: label.id, x: ax, y: ay, width: w, height: h, placed: false, side: 'moved', leader: null });
      continue;
    }
    taken.push(chosen.r);
    const touching = distanceTo(chosen.r, ax, ay) <= Math.max(gap, offset) * 1.5 + EPS;
    const end = nearestPoint(chosen.r, ax, ay);
    out.push({
      id: label.id,
      ...chosen.r,
      placed: true,
      side: chosen.side,
      leader: touching ? null : { x1: ax, y1: ay, x2: end.x, y2: end.y },
    });
  }
  return out;
}

function nearestFree(
  ax: number,
  ay: number,
  w: number,
  h: number,
  offset: number,
  bounds: LabelRect,
  taken: readonly LabelRect[],
  obstacles: readonly LabelRect[],
  pad: number,
  fits: (r: LabelRect, pad: number, avoid: boolean) => boolean,
  avoid: boolean,
): LabelRect | null {
  // A free box can slide left until it meets the left bound or a box's right edge, then up until
  // it meets the top bound or a box's bottom edge, and stays free; so these x and y values reach
  // every free region. The mirrored edges and the anchor itself give positions nearer the anchor.
  const blockers = [...taken.map((t) => ({ r: t, pad })), ...obstacles.map((o) => ({ r: o, pad: 0 }))];
  const xs = new Set<number>([bounds.x, bounds.x + bounds.width - w, ax - w / 2, ax + offset, ax - offset - w]);
  const ys = new Set<number>([bounds.y, bounds.y + bounds.height - h, ay - h / 2, ay - offset - h, ay + offset]);
  for (const { r, pad: p } of blockers) {
    xs.add(r.x + r.width + 2 * p);
    xs.add(r.x - w - 2 * p);
    ys.add(r.y + r.height + 2 * p);
    ys.add(r.y - h - 2 * p);
  }
  let best: LabelRect | null = null;
  let bestD = Infinity;
  for (const x of xs) {
    for (const y of ys) {
      const r = { x, y, width: w, height: h };
      const d = distanceTo(r, ax, ay);
      if (d >= bestD) continue;
      if (fits(r, pad, avoid)) {
        best = r;
        bestD = d;
      }
    }
  }
  return best;
}
