/**
 * Invented producer lot codes for the demo's library lots, beside the lab's own codes: Ridgeline
 * Red's lot RID-L0018 is the producer's "L24-118", the lot the demo check OP-7K3M-Q9 claims. Other
 * products get "<initial>25-0nn" (HOL-L0007 → "H25-007").
 */
export function demoProducerLotCode(lotCode: string): string | null {
  const m = /^([A-Z])[A-Z]{2}-L(\d{4})$/.exec(lotCode);
  if (!m) return null;
  const n = Number(m[2]);
  return lotCode.startsWith('RID-') ? `L24-${100 + n}` : `${m[1]}25-${String(n).padStart(3, '0')}`;
}
