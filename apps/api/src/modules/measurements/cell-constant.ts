/**
 * Cell constant from a conductivity standard: K = κ · R, with κ the standard's certified
 * conductivity (µS/cm, converted to S/cm) and R the real impedance on the plateau where the phase
 * is about 0° (Ω). Returns cm⁻¹.
 */
export function cellConstantPerCm(standardConductivityUsPerCm: number, plateauResistanceOhm: number): number {
  if (!(standardConductivityUsPerCm > 0) || !(plateauResistanceOhm > 0)) {
    throw new RangeError('conductivity and plateau resistance must both be positive');
  }
  return standardConductivityUsPerCm * 1e-6 * plateauResistanceOhm;
}
