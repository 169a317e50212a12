/**
 * Conductivity referred to the reference temperature by linear compensation:
 * κ_ref = κ_T / (1 + α(T − T_ref)).
 * @param conductivity κ at the measurement temperature, any unit (the result has the same unit)
 * @param temperatureC measurement temperature, °C
 * @param referenceTemperatureC reference temperature, °C (25 °C is common practice)
 * @param coefficientPerC α as a fraction per °C (0.02 = 2 %/°C, common practice for aqueous samples)
 */
export function referConductivity(conductivity: number, temperatureC: number, referenceTemperatureC: number, coefficientPerC: number): number {
  return conductivity / compensationFactor(temperatureC, referenceTemperatureC, coefficientPerC);
}

/** 1 + α(T − T_ref), checked to stay positive so the referral cannot flip a sign. */
export function compensationFactor(temperatureC: number, referenceTemperatureC: number, coefficientPerC: number): number {
  for (const [name, v] of [['temperatureC', temperatureC], ['referenceTemperatureC', referenceTemperatureC], ['coefficientPerC', coefficientPerC]] as const) {
    if (!Number.isFinite(v)) throw new RangeError(`${name} must be a finite number, got ${v}`);
  }
  if (coefficientPerC < 0 || coefficientPerC > 0.1) {
    throw new RangeError(`coefficientPerC is a fraction per °C (0.02 = 2 %/°C); ${coefficientPerC} is outside 0–0.1`);
  }
  const factor = 1 + coefficientPerC * (temperatureC - referenceTemperatureC);
  if (!(factor > 0)) throw new RangeError(`temperature ${temperatureC} °C is too far from ${referenceTemperatureC} °C for a linear coefficient of ${coefficientPerC}`);
  return factor;
}
