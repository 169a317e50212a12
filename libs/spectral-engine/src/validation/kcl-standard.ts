/**
 * Conductivity of potassium chloride calibration standards.
 *
 * Molal values: the CRC Handbook of Chemistry and Physics table of standard KCl solutions, after
 * Wu, Koch & Pratt (1991), at 25 °C (and 20 °C). Molar values: the everyday values printed on
 * commercial standards (common practice). A certificate's own value always wins.
 */
export type ConcentrationBasis = 'molal' | 'molar';

export interface KclStandard {
  /** mol/kg (molal) or mol/L (molar). */
  readonly concentration: number;
  readonly basis: ConcentrationBasis;
  /** κ at 25 °C, µS/cm. */
  readonly conductivityAt25UsPerCm: number;
  readonly source: string;
}

const CRC = 'CRC Handbook, standard KCl solutions (Wu, Koch & Pratt 1991)';
const COMMON = 'value printed on commercial standards (common practice)';

export const KCL_STANDARDS: readonly KclStandard[] = [
  { concentration: 0.01, basis: 'molal', conductivityAt25UsPerCm: 1408.23, source: CRC },
  { concentration: 0.1, basis: 'molal', conductivityAt25UsPerCm: 12824.6, source: CRC },
  { concentration: 1, basis: 'molal', conductivityAt25UsPerCm: 108620, source: CRC },
  { concentration: 0.01, basis: 'molar', conductivityAt25UsPerCm: 1413, source: COMMON },
  { concentration: 0.1, basis: 'molar', conductivityAt25UsPerCm: 12880, source: COMMON },
];

/** Linear temperature compensation, 2 %/°C (common practice for KCl and natural waters). */
export const KCL_COEFFICIENT_PER_C = 0.02;

export interface StandardConductivity {
  /** κ at the run's temperature, µS/cm. */
  readonly conductivityUsPerCm: number;
  readonly conductivityAt25UsPerCm: number;
  readonly source: string;
  readonly temperatureFormula: string;
}

/** The tabulated standard for a concentration and basis, or undefined. */
export function kclStandard(concentration: number, basis: ConcentrationBasis): KclStandard | undefined {
  return KCL_STANDARDS.find((s) => s.basis === basis && Math.abs(s.concentration - concentration) < 1e-9);
}

/**
 * κ of a KCl standard at `temperatureC` by linear compensation from 25 °C:
 * κ_T = κ₂₅ · (1 + α(T − 25)), α = 0.02 per °C unless given.
 * @throws RangeError for a concentration not in the table (enter the certificate value instead)
 */
export function kclConductivity(concentration: number, basis: ConcentrationBasis, temperatureC: number, coefficientPerC = KCL_COEFFICIENT_PER_C): StandardConductivity {
  const standard = kclStandard(concentration, basis);
  if (!standard) {
    const known = KCL_STANDARDS.filter((s) => s.basis === basis).map((s) => s.concentration).join(', ');
    throw new RangeError(`no tabulated ${basis} KCl standard at ${concentration}; known: ${known}. Enter the certificate's conductivity`);
  }
  return conductivityAt(standard.conductivityAt25UsPerCm, temperatureC, coefficientPerC, standard.source);
}

/** κ at `temperatureC` from κ at 25 °C by linear compensation (see kclConductivity). */
export function conductivityAt(conductivityAt25UsPerCm: number, temperatureC: number, coefficientPerC = KCL_COEFFICIENT_PER_C, source = 'certificate'): StandardConductivity {
  if (!(conductivityAt25UsPerCm > 0) || !Number.isFinite(conductivityAt25UsPerCm)) throw new RangeError(`conductivity at 25 °C must be positive, got ${conductivityAt25UsPerCm}`);
  if (!Number.isFinite(temperatureC) || temperatureC < 0 || temperatureC > 50) throw new RangeError(`temperature must be within 0–50 °C, got ${temperatureC}`);
  const factor = 1 + coefficientPerC * (temperatureC - 25);
  return {
    conductivityUsPerCm: conductivityAt25UsPerCm * factor,
    conductivityAt25UsPerCm,
    source,
    temperatureFormula: `κ_T = κ₂₅·(1 + ${coefficientPerC}·(T − 25 °C)) (linear compensation, common practice)`,
  };
}
