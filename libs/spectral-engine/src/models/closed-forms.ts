import { add, complex, div, inverse, jPower, mul, scale, tanh, type Complex } from './complex';

/*
 * Closed forms of the fractional-order elements, ω in rad/s, results in ohms.
 * Sign convention: imaginary part negative for capacitive behaviour.
 */

/** Constant phase element Z = 1/(Q(jω)ⁿ); Q in S·sⁿ. */
export const cpe = (q: number, n: number, omega: number): Complex => inverse(scale(jPower(omega, n), q));

/** ZARC, a resistor in parallel with a CPE: Z = R/(1 + RQ(jω)ⁿ). */
export const zarc = (r: number, q: number, n: number, omega: number): Complex =>
  div(complex(r), add(complex(1), scale(jPower(omega, n), r * q)));

/** Cole–Cole: Z = R∞ + (R0 − R∞)/(1 + (jωτ)^α). */
export const coleCole = (rInf: number, r0: number, tau: number, alpha: number, omega: number): Complex =>
  add(complex(rInf), div(complex(r0 - rInf), add(complex(1), jPower(omega * tau, alpha))));

/** Havriliak–Negami: Z = R∞ + (R0 − R∞)/(1 + (jωτ)^α)^β. */
export function havriliakNegami(
  rInf: number,
  r0: number,
  tau: number,
  alpha: number,
  beta: number,
  omega: number,
): Complex {
  const d = add(complex(1), jPower(omega * tau, alpha));
  const m = Math.pow(Math.hypot(d.re, d.im), -beta);
  const t = -beta * Math.atan2(d.im, d.re);
  return { re: rInf + (r0 - rInf) * m * Math.cos(t), im: (r0 - rInf) * m * Math.sin(t) };
}

/** Semi-infinite Warburg: Z = σ(1 − j)/√ω; σ in Ω·s^(−½). */
export function warburg(sigma: number, omega: number): Complex {
  const k = sigma / Math.sqrt(omega);
  return { re: k, im: -k };
}

/** √(jωτ) = √(ωτ/2)·(1 + j). */
function sqrtJ(omegaTau: number): Complex {
  const k = Math.sqrt(omegaTau / 2);
  return { re: k, im: k };
}

/** Finite-length (transmissive) Warburg: Z = Z0·tanh√(jωτ)/√(jωτ). */
export function warburgFiniteLength(z0: number, tau: number, omega: number): Complex {
  const s = sqrtJ(omega * tau);
  return scale(div(tanh(s), s), z0);
}

/** Finite-space (reflective) Warburg: Z = Z0·coth√(jωτ)/√(jωτ). */
export function warburgFiniteSpace(z0: number, tau: number, omega: number): Complex {
  const s = sqrtJ(omega * tau);
  return scale(inverse(mul(tanh(s), s)), z0);
}

/**
 * Randles cell with a CPE double layer: Rs + [Q(jω)ⁿ + 1/(Rct + σ(1 − j)/√ω)]⁻¹.
 * With n = 1 the CPE is an ideal capacitor of Q farads.
 */
export function randlesCpe(rs: number, rct: number, q: number, n: number, sigma: number, omega: number): Complex {
  const faradaic = add(complex(rct), warburg(sigma, omega));
  const admittance = add(scale(jPower(omega, n), q), inverse(faradaic));
  return add(complex(rs), inverse(admittance));
}
