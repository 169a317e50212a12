import { impedance } from './impedance';
import { MODEL_CATALOG, modelLabel } from './model-catalog';
import { ModelDefinitionError } from './model-definition-error';
import { BUILTIN_MODELS } from './builtin-models';
import { defineExpressionModel } from './expression-model';

const f = Float64Array.of(0.1, 1, 10, 100, 1000, 1e4);

function definitionError(expression: string): ModelDefinitionError {
  try {
    defineExpressionModel(expression);
  } catch (e) {
    if (e instanceof ModelDefinitionError) return e;
    throw e;
  }
  throw new Error('expected the expression to be refused');
}

describe('lab-defined model expressions', () => {
  it('evaluates like the built-in model it spells out', () => {
    const own = impedance('r + 1/(q*(j*ω)^n)', { r: 50, q: 2e-6, n: 0.9 }, f);
    const builtin = impedance('r-cpe', { r: 50, q: 2e-6, n: 0.9 }, f);
    own.re.forEach((v, i) => {
      expect(v).toBeCloseTo(builtin.re[i], 9);
      expect(own.im[i]).toBeCloseTo(builtin.im[i], 9);
    });
  });

  it('takes parameters in order of appearance with bounds [0, ∞) unless told otherwise', () => {
    const m = defineExpressionModel('rs + r/(1 + r*q*(j*omega)^n)', { parameters: [{ name: 'n', lower: 0, upper: 1, unit: '1' }] });
    expect(m.parameters.map((p) => p.name)).toEqual(['rs', 'r', 'q', 'n']);
    expect(m.parameters[0]).toMatchObject({ lower: 0, upper: null });
    expect(m.parameters[3]).toMatchObject({ lower: 0, upper: 1, unit: '1' });
  });

  it('names the bad token and where it is', () => {
    const unknownFunction = definitionError('r + foo(ω)');
    expect(unknownFunction.token).toBe('foo');
    expect(unknownFunction.position).toBe(5);
    expect(unknownFunction.message).toMatch(/^'foo' at character 5: unknown function/);
    expect(definitionError('r + (q').message).toMatch(/cannot read the model expression: Parenthesis \) expected/);
    expect(definitionError('r = 5').message).toMatch(/assignment syntax is not allowed/);
    expect(definitionError('r + $x').token).toBe('$x');
    expect(definitionError('r + sqrt').message).toMatch(/'sqrt' at character 5: is a function/);
    expect(definitionError('').message).toBe('the model expression is empty');
    expect(() => defineExpressionModel('r + q*ω', { parameters: [{ name: 'k' }] })).toThrow("parameter 'k' does not appear in the expression");
  });

  it('explains a name that is neither a built-in model nor an expression', () => {
    expect(() => impedance('colecole', {}, f)).toThrow(
      /^'colecole' is not a built-in model \(cpe, r-cpe, .*\) and not a usable expression: the expression does not use ω/,
    );
  });

  it('checks the parameters it is given', () => {
    expect(() => impedance('cpe', { q: 1e-5 }, f)).toThrow("model 'cpe' needs parameter 'n'");
    expect(() => impedance('cpe', { q: 1e-5, n: 0.8, r: 1 }, f)).toThrow("model 'cpe' has no parameter 'r' (it has q, n)");
    expect(() => impedance('cpe', { q: NaN, n: 0.8 }, f)).toThrow("parameter 'q' must be a finite number, got NaN");
  });
});

describe('model catalog', () => {
  it('lists every built-in model with units and bounds, as plain JSON', () => {
    const names = MODEL_CATALOG.map((m) => m.name);
    expect(names).toEqual(expect.arrayContaining(['cpe', 'r-cpe', 'cole-cole', 'havriliak-negami', 'warburg', 'randles-cpe']));
    const coleCole = MODEL_CATALOG.find((m) => m.name === 'cole-cole')!;
    expect(coleCole.parameters.map((p) => [p.name, p.unit, p.lower, p.upper])).toEqual([
      ['rInf', 'Ω', 0, null],
      ['r0', 'Ω', 0, null],
      ['tau', 's', 0, null],
      ['alpha', '1', 0, 1],
    ]);
    expect(JSON.parse(JSON.stringify(MODEL_CATALOG))).toEqual(MODEL_CATALOG);
  });

  it('names a built-in model as a reader calls it and leaves a lab-defined one as the lab named it', () => {
    expect(modelLabel('cole-cole')).toBe('Cole–Cole relaxation');
    expect(modelLabel('our-two-arc-model')).toBe('our-two-arc-model');
  });

  it('evaluates every catalog model to finite values across 10 mHz to 10 MHz', () => {
    const wide = Float64Array.from({ length: 41 }, (_, i) => 10 ** (-2 + (9 * i) / 40));
    for (const m of MODEL_CATALOG) {
      const p = Object.fromEntries(m.parameters.map((q) => [q.name, q.upper === 1 ? 0.8 : q.name.startsWith('q') ? 1e-5 : q.name === 'tau' ? 1e-3 : 100]));
      const s = impedance(m.name, p, wide);
      expect([...s.re, ...s.im].every(Number.isFinite)).toBe(true);
    }
  });
});

describe('analytic derivatives', () => {
  it('agree with central differences wherever a built-in model provides them', () => {
    const omega = Float64Array.from({ length: 30 }, (_, i) => 2 * Math.PI * 10 ** (-1 + (6 * i) / 29));
    const n = omega.length;
    const points: Record<string, number[]> = {
      'cole-cole': [80, 1200, 3e-4, 0.72],
      cpe: [2e-6, 0.83],
      'r-cpe': [40, 5e-6, 0.9],
      'r-zarc': [15, 300, 2e-5, 0.85],
    };
    for (const [name, values] of Object.entries(points)) {
      const model = BUILTIN_MODELS.get(name)!;
      const p = Float64Array.from(values);
      const re = new Float64Array(n);
      const im = new Float64Array(n);
      const dRe = new Float64Array(n * p.length);
      const dIm = new Float64Array(n * p.length);
      model.derivatives!(p, omega, re, im, dRe, dIm);
      p.forEach((v, j) => {
        const h = 1e-6 * v;
        const up = Float64Array.from(p);
        const down = Float64Array.from(p);
        up[j] += h;
        down[j] -= h;
        const [ur, ui, lr, li] = [new Float64Array(n), new Float64Array(n), new Float64Array(n), new Float64Array(n)];
        model.evaluate(up, omega, ur, ui);
        model.evaluate(down, omega, lr, li);
        for (let i = 0; i < n; i++) {
          const scale = Math.hypot(re[i], im[i]) / v;
          expect(Math.abs(dRe[j * n + i] - (ur[i] - lr[i]) / (2 * h))).toBeLessThan(1e-6 * scale);
          expect(Math.abs(dIm[j * n + i] - (ui[i] - li[i]) / (2 * h))).toBeLessThan(1e-6 * scale);
        }
      });
    }
  });
});
