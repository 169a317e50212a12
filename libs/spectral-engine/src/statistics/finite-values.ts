/**
 * Rejects a non-finite entry with a message naming the argument and the position, because a
 * silently dropped or propagated NaN would change a statistic without anyone noticing.
 */
export function assertFiniteValues(values: ArrayLike<number>, name: string, context: string): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new RangeError(`${context}: ${name}[${i}] is ${values[i]}; every value must be a finite number`);
    }
  }
}
