/** An SVG path through the points in order; non-finite points break the line instead of drawing to 0. */
export function polylinePath(xs: ArrayLike<number>, ys: ArrayLike<number>): string {
  let d = '';
  let pen = false;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    const y = ys[i];
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${round(x)},${round(y)}`;
    pen = true;
  }
  return d;
}

/**
 * A closed band between a lower and an upper curve over the same x positions: along the lower
 * curve, back along the upper one.
 */
export function bandPath(xs: ArrayLike<number>, lows: ArrayLike<number>, highs: ArrayLike<number>): string {
  const n = xs.length;
  if (n === 0) return '';
  let d = `M${round(xs[0])},${round(lows[0])}`;
  for (let i = 1; i < n; i++) d += `L${round(xs[i])},${round(lows[i])}`;
  for (let i = n - 1; i >= 0; i--) d += `L${round(xs[i])},${round(highs[i])}`;
  return `${d}Z`;
}

/**
 * Axis-aligned rectangles in one path. Every rectangle is drawn with the same winding, so under
 * the nonzero fill rule overlaps fill once: the union shades evenly.
 */
export function rectanglesPath(rects: readonly { x0: number; y0: number; x1: number; y1: number }[]): string {
  return rects
    .map(({ x0, y0, x1, y1 }) => {
      const [left, right] = x0 <= x1 ? [x0, x1] : [x1, x0];
      const [top, bottom] = y0 <= y1 ? [y0, y1] : [y1, y0];
      return `M${round(left)},${round(top)}H${round(right)}V${round(bottom)}H${round(left)}Z`;
    })
    .join('');
}

/** Two decimals are far below a pixel and keep the markup small. */
function round(v: number): number {
  return Math.round(v * 100) / 100;
}
