import fc from 'fast-check';
import { parseSpectrumFile } from './parse-spectrum-file';
import { SpectrumImportError } from './spectrum-import-error';

const rows = (sep: string, decimal = '.') =>
  [
    [1000, 120.5, -30.25],
    [100, 150, -60.5],
    [10, 200, -90],
    [1, 260, -40],
    [0.1, 300, -10],
  ].map((r) => r.map((v) => String(v).replace('.', decimal)).join(sep));

function importError(text: string, options = {}): SpectrumImportError {
  try {
    parseSpectrumFile(text, options);
  } catch (e) {
    if (e instanceof SpectrumImportError) return e;
    throw e;
  }
  throw new Error('expected the file to be rejected');
}

describe('parseSpectrumFile', () => {
  it('reads (f, Z′, Z″) with a semicolon and sorts frequencies ascending', () => {
    const s = parseSpectrumFile(['Frequency (Hz);Z\' (Ω);Z\'\' (Ω)', ...rows(';')].join('\n'));
    expect(Array.from(s.frequencyHz)).toEqual([0.1, 1, 10, 100, 1000]);
    expect(Array.from(s.re)).toEqual([300, 260, 200, 150, 120.5]);
    expect(Array.from(s.im)).toEqual([-10, -40, -90, -60.5, -30.25]);
  });

  it('reads −Z″ columns with kHz and kΩ, tabs, decimal commas, CRLF, a BOM and metadata lines', () => {
    const text =
      '\uFEFFInstrument: demo analyser\r\nOperator: demo\r\n\r\nFreq/kHz\t-Z" / kOhm\tZ\u2032 / kOhm\r\n' +
      ['2,5\t0,1\t1,25', '1\t0,2\t1,5', '0,5\t0,3\t1,75', '0,25\t0,2\t2', '0,1\t0,1\t2,25'].join('\r\n');
    const s = parseSpectrumFile(text);
    expect(Array.from(s.frequencyHz)).toEqual([100, 250, 500, 1000, 2500]);
    expect(Array.from(s.re)).toEqual([2250, 2000, 1750, 1500, 1250]);
    expect(Array.from(s.im)).toEqual([-100, -200, -300, -200, -100]);
  });

  it('reads |Z| and phase in degrees or radians, MHz and MΩ', () => {
    const deg = parseSpectrumFile(['f [MHz],|Z| [MOhm],Phase [deg]', '1,2,-90', '2,2,0', '3,2,-60', '4,1,-30', '5,1,-45'].join('\n'));
    expect(deg.frequencyHz[0]).toBe(1e6);
    expect(deg.re[0]).toBeCloseTo(0, 6);
    expect(deg.im[0]).toBeCloseTo(-2e6, 6);
    expect(deg.re[2]).toBeCloseTo(1e6, 6);
    expect(deg.im[2]).toBeCloseTo(-Math.sqrt(3) * 1e6, 6);
    const rad = parseSpectrumFile(['Frequency (Hz);Zmod (Ohm);Zphz (rad)', '1;10;-1,5707963267948966', '2;10;0', '3;10;-0,5', '4;10;-0,25', '5;10;-1'].join('\n'));
    expect(rad.re[0]).toBeCloseTo(0, 12);
    expect(rad.im[0]).toBeCloseTo(-10, 12);
  });

  it('ignores columns it does not use and lets the caller name columns and units', () => {
    const text = ['Time;A;B;C', ...rows(';').map((r, i) => `${i};${r}`)].join('\n');
    const unnamed = importError(text);
    expect(unnamed.line).toBe(1);
    expect(unnamed.reason).toMatch(/no header row found: the line above the numbers does not name the columns/);
    const s = parseSpectrumFile(text, {
      columns: { frequency: 'A', real: 'B', imaginary: 'C' },
      units: { frequency: 'Hz', impedance: 'kΩ' },
    });
    expect(s.re[0]).toBe(300000);
    const headerless = parseSpectrumFile(rows(',').join('\n'), {
      columns: { frequency: 1, real: 2, imaginary: 3 },
      units: { frequency: 'Hz', impedance: 'Ω' },
    });
    expect(headerless.frequencyHz.length).toBe(5);
  });

  it('reads names that carry their own brackets, such as Re(Z) and Phase(Z)', () => {
    const s = parseSpectrumFile(['Freq (Hz)\tRe(Z) (Ohm)\t-Im(Z) (Ohm)', '1\t5\t2', '2\t4\t1', '3\t3\t1', '4\t2\t1', '5\t1\t1'].join('\n'));
    expect([s.re[0], s.im[0]]).toEqual([5, -2]);
    const polar = parseSpectrumFile(['Frequency (Hz),|Z| (Ohm),Phase(Z) (°)', '1,2,0', '2,2,0', '3,2,0', '4,2,0', '5,2,-90'].join('\n'));
    expect(polar.im[4]).toBeCloseTo(-2, 12);
  });

  it('refuses hostile input without stalling: huge lines and unclosed brackets', () => {
    expect(importError(';'.repeat(1e6)).reason).toMatch(/more than 1000 cells on one line/);
    expect(importError(`Frequency (${' '.repeat(1e5)}x;Z' (Ω);Z'' (Ω)\n1;2;3`).reason).toMatch(/no header row found/);
  });

  it('rejects an empty file and a binary file', () => {
    expect(importError('').reason).toMatch(/empty/);
    expect(importError(' \r\n\n').reason).toMatch(/empty/);
    const binary = importError('Frequency (Hz);Z\' (Ω)\n\u0000\u0001PK\u0003');
    expect(binary.reason).toMatch(/binary/);
    expect(binary.line).toBe(2);
  });

  it('names the line and column of a non-numeric cell', () => {
    const lines = ['# exported by a demo analyser', 'Frequency (Hz);Z\' (Ω);Z\'\' (Ω)', ...rows(';')];
    lines[4] = '10;2O0;-90';
    const e = importError(lines.join('\n'));
    expect(e.line).toBe(5);
    expect(e.column).toBe(4);
    expect(e.message).toBe("line 5, column 4: expected a number for 'Z' (Ω)', found '2O0'");
  });

  it('rejects too few columns, missing units, non-positive and duplicated frequencies, too few points', () => {
    const header = 'Frequency (Hz);Z\' (Ω);Z\'\' (Ω)';
    const short = importError([header, '1;2;3', '2;3'].join('\n'));
    expect([short.line, short.reason]).toEqual([3, 'too few columns: expected at least 3 separated by semicolon, found 2']);
    const noUnit = importError(['Frequency;Z\' (Ω);Z\'\' (Ω)', ...rows(';')].join('\n'));
    expect(noUnit.line).toBe(1);
    expect(noUnit.reason).toMatch(/'Frequency' \(frequency\) names no unit/);
    const badUnit = importError(['Frequency (rad/s);Z\' (Ω);Z\'\' (Ω)', ...rows(';')].join('\n'));
    expect(badUnit.reason).toMatch(/unit 'rad\/s'/);
    const zero = importError([header, ...rows(';'), '0;1;-1'].join('\n'));
    expect([zero.line, zero.column]).toEqual([7, 1]);
    expect(zero.reason).toMatch(/frequency must be positive/);
    const twice = importError([header, ...rows(';'), '100;1;-1'].join('\n'));
    expect(twice.line).toBe(7);
    expect(twice.reason).toMatch(/appears twice \(also on line 3\)/);
    const few = importError([header, ...rows(';').slice(0, 3)].join('\n'));
    expect(few.reason).toMatch(/only 3 data rows: expected at least 5/);
    expect(parseSpectrumFile([header, ...rows(';').slice(0, 3)].join('\n'), { minPoints: 3 }).frequencyHz.length).toBe(3);
  });

  it('rejects a header that does not make a spectrum, and data before the header', () => {
    expect(importError(['Frequency (Hz);Z\' (Ω)', ...rows(';')].join('\n')).reason).toMatch(/do not make a spectrum/);
    const early = importError([...rows(';'), 'Frequency (Hz);Z\' (Ω);Z\'\' (Ω)'].join('\n'));
    expect(early.line).toBe(1);
    expect(early.reason).toMatch(/numbers before any header row/);
  });

  it('reads a tab-separated export with sixty metadata lines before thirty-five data rows', () => {
    const metadata = Array.from({ length: 60 }, (_, i) => (i % 3 === 0 ? `Setting ${i}: value ${i}` : i % 3 === 1 ? `Note ${i}` : `Operator\tdemo ${i}`));
    const data = Array.from({ length: 35 }, (_, i) => `${10 ** (5 - i / 7)}\t${100 + i}\t${-i - 1}`);
    const s = parseSpectrumFile([...metadata, 'Freq (Hz)\tZ\' (Ohm)\tZ\'\' (Ohm)', ...data].join('\n'));
    expect(s.frequencyHz.length).toBe(35);
    expect(s.frequencyHz[34]).toBe(1e5);
    expect([s.re[34], s.im[34]]).toEqual([100, -1]);
    // A bad cell in those rows is named by its own line and column, not by line 1.
    const broken = [...metadata, 'Freq (Hz)\tZ\' (Ohm)\tZ\'\' (Ohm)', ...data];
    broken[70] = '12\tabc\t-3';
    const e = importError(broken.join('\n'));
    expect([e.line, e.column]).toEqual([71, 4]);
    expect(e.reason).toMatch(/expected a number for 'Z' \(Ohm\)', found 'abc'/);
  });

  it('names the line that has no separator rather than line 1', () => {
    const e = importError(['Demo analyser export', 'Freq (Hz) Z (Ohm)', '1 2 3', '2 3 4'].join('\n'));
    expect(e.line).toBe(3);
    expect(e.reason).toMatch(/no cell separator found: this line starts with a number but has no tab, semicolon or comma/);
  });

  it('reads snake-case headers with units as suffixes and a neg_ or minus_ prefix for −Z″', () => {
    const expected = { f: [1, 10, 100, 1000, 10000], re: [500, 400, 300, 200, 100], im: [-50, -40, -30, -20, -10] };
    const body = (scaleF: number, scaleZ: number, negate: boolean, sep = ',') =>
      expected.f.map((f, i) => [f / scaleF, expected.re[i] / scaleZ, (negate ? -1 : 1) * (expected.im[i] / scaleZ)].join(sep));
    const cases: [string, number, number, boolean][] = [
      ['freq_hz,z_real_ohm,neg_z_imag_ohm', 1, 1, true],
      ['frequency_khz,z_real_kohm,minus_z_imag_kohm', 1e3, 1e3, true],
      ['freq_MHz,z_re_MOhm,z_im_MOhm', 1e6, 1e6, false],
      ['freq_mHz,z_real_mOhm,z_imag_mOhm', 1e-3, 1e-3, false],
      ["freq_hz,z_real (Ohm),neg_z_imag (Ohm)", 1, 1, true],
    ];
    for (const [header, scaleF, scaleZ, negate] of cases) {
      const s = parseSpectrumFile([header, ...body(scaleF, scaleZ, negate)].join('\n'));
      expect(Array.from(s.frequencyHz).map((v) => Number(v.toPrecision(12)))).toEqual(expected.f);
      expect(Array.from(s.re).map((v) => Number(v.toPrecision(12)))).toEqual(expected.re.slice().reverse().reverse());
      expect(Array.from(s.im).map((v) => Number(v.toPrecision(12)))).toEqual(expected.im);
    }
    const polar = parseSpectrumFile(['freq_hz;z_mod_ohm;phase_deg', '1;2;-90', '2;2;0', '3;2;0', '4;2;0', '5;2;0'].join('\n'));
    expect(polar.im[0]).toBeCloseTo(-2, 12);
    const radians = parseSpectrumFile(['freq_hz;z_mod_ohm;phase_rad', '1;2;-1,5707963267948966', '2;2;0', '3;2;0', '4;2;0', '5;2;0'].join('\n'));
    expect(radians.im[0]).toBeCloseTo(-2, 12);
  });

  it('refuses a lower-case suffix that could be milli or mega, naming line and column, unless the caller says', () => {
    const lines = ['# demo', 'freq_hz;z_real_mohm;z_imag_mohm', ...rows(';')];
    const e = importError(lines.join('\n'));
    expect([e.line, e.column]).toEqual([2, 9]);
    expect(e.reason).toMatch(/'z_real_mohm' \(Z′\) gives an ambiguous unit: 'mohm' could be milliohm or megaohm/);
    const f = importError(['freq_mhz;z_real_ohm;z_imag_ohm', ...rows(';')].join('\n'));
    expect([f.line, f.column]).toEqual([1, 1]);
    expect(f.reason).toMatch(/'mhz' could be millihertz or megahertz/);
    expect(parseSpectrumFile(lines.join('\n'), { units: { impedance: 'MΩ' } }).re[0]).toBe(300e6);
    // A name with no unit at all stays a refusal: nothing is guessed.
    expect(importError(['freq_hz;z_real;z_imag', ...rows(';')].join('\n')).reason).toMatch(/'z_real' \(Z′\) names no unit/);
  });

  it('reads a valid file with one character changed, or rejects it with SpectrumImportError', () => {
    const valid = ['Frequency (Hz);Z\' (Ω);Z\'\' (Ω)', ...rows(';')].join('\r\n');
    fc.assert(
      fc.property(fc.nat(valid.length - 1), fc.constantFrom('', ';', ',', '.', '-', 'e', '0', '\n', 'x', '\t', '"'), (at, ch) => {
        const text = valid.slice(0, at) + ch + valid.slice(at + 1);
        try {
          expect(parseSpectrumFile(text).frequencyHz.length).toBeGreaterThanOrEqual(5);
        } catch (e) {
          expect(e).toBeInstanceOf(SpectrumImportError);
          expect((e as SpectrumImportError).reason.length).toBeGreaterThan(10);
        }
      }),
      { numRuns: 1500 },
    );
  });

  it('never throws anything but SpectrumImportError, whatever the text', () => {
    const cell = fc.oneof(
      fc.double({ noNaN: false }).map(String),
      fc.constantFrom('Frequency (Hz)', "Z' (Ω)", "Z'' (Ω)", '|Z| (kΩ)', 'Phase (°)', '-Z\'\' (MOhm)', 'f [kHz]', '', '"', 'NaN', '1,5', '-0', '1e999'),
      fc.string({ maxLength: 8 }),
    );
    const line = fc.array(cell, { maxLength: 6 }).chain((cells) => fc.constantFrom(';', ',', '\t').map((d) => cells.join(d)));
    const file = fc.oneof(
      fc.array(line, { maxLength: 30 }).chain((ls) => fc.constantFrom('\n', '\r\n', '\r').map((nl) => ls.join(nl))),
      fc.string({ maxLength: 200 }),
      fc.uint8Array({ maxLength: 200 }).map((b) => String.fromCharCode(...b)),
    );
    fc.assert(
      fc.property(file, (text) => {
        try {
          const s = parseSpectrumFile(text, { minPoints: 1 });
          for (let i = 1; i < s.frequencyHz.length; i++) expect(s.frequencyHz[i]).toBeGreaterThan(s.frequencyHz[i - 1]);
        } catch (e) {
          expect(e).toBeInstanceOf(SpectrumImportError);
        }
      }),
      { numRuns: 3000 },
    );
  });
});
