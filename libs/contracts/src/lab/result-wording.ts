import type { FitWeighting } from './analyses';

/** A share 0–1 as the report prints it: one decimal, no trailing zero ("17 %", "2.5 %"). */
export function percentText(share: number): string {
  return `${Number((share * 100).toFixed(1))} %`;
}

/**
 * What "Typicality" means, in one sentence: the same words on the screens (beside the figure and
 * as its tooltip) and in the report.
 */
export function typicalityText(typicality: number | null): string {
  if (typicality === null) return 'Typicality is not available: the library has no calibration distances to compare with.';
  return `${percentText(typicality)} of the library's calibration distances are larger than the sample's: the share of authentic lots that sit further from their nearest neighbour than this sample sits from its nearest lot (0 % means further out than every authentic lot).`;
}

const WEIGHTING_TEXT: Record<FitWeighting, string> = {
  modulus: 'modulus weighting',
  proportional: 'proportional weighting',
  unit: 'unit weighting',
};

/** How χ² weighed the residuals, in words ("modulus weighting": each residual divided by |Z|). */
export function weightingText(weighting: FitWeighting): string {
  return WEIGHTING_TEXT[weighting];
}

/** What each weighting does, as the end of a sentence (lower case, full stop) beside χ². */
export function weightingExplained(weighting: FitWeighting): string {
  switch (weighting) {
    case 'modulus':
      return 'each residual is divided by |Z| at its frequency, so every frequency counts alike.';
    case 'proportional':
      return 'each residual is divided by the size of its own part (Z′ or Z″).';
    case 'unit':
      return 'residuals are not scaled, so the largest impedances dominate χ².';
  }
}

/**
 * Whether two lot codes name the same lot, ignoring case, spaces and dashes ("L24-118", "l24 118");
 * common practice for codes typed from a label.
 */
export function sameLotCode(a: string, b: string): boolean {
  const norm = (s: string) => s.normalize('NFKC').toUpperCase().replace(/[\s\-_./]+/g, '');
  const x = norm(a);
  return x.length > 0 && x === norm(b);
}
