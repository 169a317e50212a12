import { parseSpectrumFile } from './parse-spectrum-file';
import { SpectrumImportError } from './spectrum-import-error';

const HEADER = "Frequency (Hz);Z' (Ω);Z'' (Ω)";
const GOOD = ['1000;120.5;-30.25', '100;150;-60.5', '10;200;-90', '1;260;-40', '0.1;300;-10'];

function refusal(lines: string[], options = {}): SpectrumImportError {
  try {
    parseSpectrumFile([HEADER, ...lines].join('\n'), options);
  } catch (e) {
    if (e instanceof SpectrumImportError) return e;
    throw e;
  }
  throw new Error('expected the file to be refused');
}

describe('parseSpectrumFile: values no instrument measures', () => {
  it('refuses an all-zero impedance at its first line', () => {
    const e = refusal(['1000;0;0', '100;0;0', '10;0;0', '1;0;0', '0.1;0;0']);
    expect(e.message).toMatch(/impedance is zero/);
    expect([e.line, e.column]).toEqual([2, 6]);
  });

  it('refuses 1e-300 Ω and 1e200 Ω, naming the line and column of the cell', () => {
    const tiny = refusal([...GOOD.slice(0, 3), '1;1e-300;-40', '0.1;300;-10']);
    expect(tiny.message).toMatch(/1e-300 is outside the plausible range/);
    expect([tiny.line, tiny.column]).toEqual([5, 3]);
    const huge = refusal([...GOOD.slice(0, 2), '10;200;-1e200', ...GOOD.slice(3)]);
    expect(huge.message).toMatch(/-1e200 is outside the plausible range/);
    expect([huge.line, huge.column]).toEqual([4, 8]);
  });

  it('refuses a 1e308 Hz frequency', () => {
    const e = refusal(['1e308;120;-30', ...GOOD.slice(1)]);
    expect(e.message).toMatch(/frequency 1e308 is outside the plausible range/);
    expect([e.line, e.column]).toEqual([2, 1]);
  });

  it('keeps a zero reactance (a purely resistive point) and ordinary values', () => {
    const s = parseSpectrumFile([HEADER, '1000;120;0', ...GOOD.slice(1)].join('\n'));
    expect(Array.from(s.im)).toEqual([-10, -40, -90, -60.5, 0]);
  });

  it('stops at the first row beyond maxPoints', () => {
    const e = refusal(GOOD, { maxPoints: 3 });
    expect(e.message).toMatch(/more than 3 data rows/);
    expect(e.line).toBe(5);
    expect(parseSpectrumFile([HEADER, ...GOOD].join('\n'), { maxPoints: 5 }).frequencyHz).toHaveLength(5);
  });
});
