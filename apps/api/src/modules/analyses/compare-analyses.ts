import type { AnalysisResult } from '@ohmprint/contracts';

/**
 * Relative tolerance for "the same number". Recomputation runs the same code on the same
 * stored bits, so results normally agree exactly; this only absorbs a change of platform maths.
 */
const RELATIVE_TOLERANCE = 1e-9;

interface Difference {
  field: string;
  stored: unknown;
  recomputed: unknown;
}

/** Compares the numbers behind two results field by field. */
export function compareAnalyses(
  stored: AnalysisResult,
  recomputed: AnalysisResult,
  everyLot: { stored: ArrayLike<number>; recomputed: ArrayLike<number> } | null = null,
): { differences: Difference[]; maxAbsoluteDifference: number } {
  const differences: Difference[] = [];
  let maxAbsoluteDifference = 0;
  const number = (field: string, a: number | null, b: number | null) => {
    if (a === null || b === null) {
      if (a !== b) differences.push({ field, stored: a, recomputed: b });
      return;
    }
    const diff = Math.abs(a - b);
    maxAbsoluteDifference = Math.max(maxAbsoluteDifference, diff);
    if (diff > RELATIVE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b), Number.MIN_VALUE)) differences.push({ field, stored: a, recomputed: b });
  };
  if (stored.verdict !== recomputed.verdict) differences.push({ field: 'verdict', stored: stored.verdict, recomputed: recomputed.verdict });
  if (stored.nearest?.lotId !== recomputed.nearest?.lotId) differences.push({ field: 'nearest.lotId', stored: stored.nearest?.lotId, recomputed: recomputed.nearest?.lotId });
  number('nearest.distance', stored.nearest?.distance ?? null, recomputed.nearest?.distance ?? null);
  number('t95', stored.t95, recomputed.t95);
  number('t99', stored.t99, recomputed.t99);
  number('typicality', stored.typicality, recomputed.typicality);
  if (stored.distances.length !== recomputed.distances.length) {
    differences.push({ field: 'distances.length', stored: stored.distances.length, recomputed: recomputed.distances.length });
  } else {
    stored.distances.forEach((d, i) => number(`distances[${i}]`, d.distance, recomputed.distances[i].distance));
  }
  if (everyLot) {
    // Every lot's distance, stored apart from the result, in the version's lot order.
    if (everyLot.stored.length !== everyLot.recomputed.length) {
      differences.push({ field: 'lotDistances.length', stored: everyLot.stored.length, recomputed: everyLot.recomputed.length });
    } else {
      for (let i = 0; i < everyLot.stored.length; i++) number(`lotDistances[${i}]`, everyLot.stored[i], everyLot.recomputed[i]);
    }
  }
  number('map.sample.x', stored.map.sample[0], recomputed.map.sample[0]);
  number('map.sample.y', stored.map.sample[1], recomputed.map.sample[1]);
  const fitted = new Map(recomputed.fit?.parameters.map((p) => [p.name, p.value]) ?? []);
  for (const p of stored.fit?.parameters ?? []) number(`fit.${p.name}`, p.value, fitted.get(p.name) ?? null);
  return { differences, maxAbsoluteDifference };
}
