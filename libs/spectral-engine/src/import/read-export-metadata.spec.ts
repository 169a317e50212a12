import { readExportMetadata, type ExportMetadata } from './read-export-metadata';

/** The demo lab's code format (Crockford base-32 letters), as the API passes it. */
const CODE = /^OP-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{2}$/;
const read = (fileName: string, text: string) => readExportMetadata(fileName, text, { codePattern: CODE });
const DATA = ['Frequency (Hz),Z\' (Ohm),Z\'\' (Ohm)', '1000000.0,184.79,-6.25', '794328.23,185.69,-7.22'].join('\n');

describe('readExportMetadata: sample codes', () => {
  it.each<[string, string, string, Partial<ExportMetadata>]>([
    ['code in the file name and a comment line', 'OP-8MJA-4T_whole-milk_rep1.csv', `# Sample: OP-8MJA-4T  Replicate: 1\n${DATA}`,
      { fileNameCodes: ['OP-8MJA-4T'], sample: { text: 'OP-8MJA-4T', codes: ['OP-8MJA-4T'], line: 1 } }],
    ['sample_id=… and a path in the file name', 'C:\\exports\\run 4\\op-7k2m-4q.txt', `sample_id=OP-7K2M-4Q\n${DATA}`,
      { fileNameCodes: ['OP-7K2M-4Q'], sample: { text: 'OP-7K2M-4Q', codes: ['OP-7K2M-4Q'], line: 1 } }],
    ['a sample name without a code', 'sweep-0042.csv', `Sample Name: Whole milk, tank 3\n${DATA}`,
      { fileNameCodes: [], sample: { text: 'Whole milk, tank 3', codes: [], line: 1 } }],
    ['a key cell followed by its value cell (semicolons)', 'export.csv', `Title;Sweep\nSampleID;OP-6TBS-3H\nFreq / kHz;Zre / kOhm;-Zim / kOhm\n1000,0;0,39;0,0049\n794,3;0,39;0,0059`,
      { sample: { text: 'OP-6TBS-3H', codes: ['OP-6TBS-3H'], line: 2 } }],
    ['no statement at all', 'data.csv', DATA, { fileNameCodes: [], sample: null, temperature: null, instrument: null, measuredAt: null }],
    ['a look-alike that breaks the alphabet (I, L, O, U are not used) is no code', 'OP-ILOU-4T.csv', `Sample: OP-8MJA-4TX\n${DATA}`,
      { fileNameCodes: [], sample: { text: 'OP-8MJA-4TX', codes: [], line: 1 } }],
  ])('%s', (_name, fileName, text, expected) => {
    expect(read(fileName, text)).toMatchObject(expected);
  });

  it('reads no code without the lab pattern, but keeps the sample as written', () => {
    const m = readExportMetadata('OP-8MJA-4T.csv', `Sample: OP-8MJA-4T\n${DATA}`);
    expect(m.fileNameCodes).toEqual([]);
    expect(m.sample).toEqual({ text: 'OP-8MJA-4T', codes: [], line: 1 });
  });

  it('does not read the column header or the data as statements', () => {
    const m = read('x.csv', `Temperature (°C),Frequency (Hz),Z' (Ohm)\n20.1,1000,12\n20.2,100,13\nSample: OP-8MJA-4T\n`);
    expect(m.temperature).toBeNull();
    expect(m.sample).toBeNull();
  });
});

describe('readExportMetadata: temperature', () => {
  // Conversions: t/°C = T/K − 273.15 (SI Brochure, 9th ed., 2.3.1, a definition);
  // t/°C = (t/°F − 32) × 5/9 (NIST SP 811, 2008, Appendix B.9, exact by definition).
  it.each<[string, string, number, string]>([
    ['Temperature: 19 C', 'degC', 19, 'the demo exports'],
    ['# Temperature: 20.5 °C', 'degC', 20.5, 'comment mark, degree sign'],
    ['Temperature (°C): 21.5', 'degC', 21.5, 'unit in the key'],
    ['temp_c=22.25', 'degC', 22.25, 'snake-case key with a unit suffix'],
    ['Sample temperature;20,5;°C', 'degC', 20.5, 'decimal comma in cells'],
    ['Temperature,25.0,C', 'degC', 25, 'comma-separated cells'],
    ['Temperature = 25 ℃', 'degC', 25, 'the ℃ sign'],
    ['Temperature [K]: 293.15', 'K', 20, 'kelvin: 293.15 K is 20 °C by the SI definition'],
    ['Temperature: 298.15 K', 'K', 25, 'kelvin in the value'],
    ['Temperature: 68 °F', 'degF', 20, 'Fahrenheit: (68 − 32) × 5/9 = 20'],
    ['TEMP(F)=32', 'degF', 0, 'the ice point: 32 °F = 0 °C'],
    ['Temperature: -4 F', 'degF', -20, '(−4 − 32) × 5/9 = −20'],
    ['Measurement temperature: −1.5 degC', 'degC', -1.5, 'Unicode minus'],
  ])('%s → %s', (line, unit, celsius) => {
    const t = read('x.csv', `${line}\n${DATA}`).temperature;
    expect(t).toMatchObject({ unit, line: 1 });
    expect(t?.celsius).toBeCloseTo(celsius, 9);
  });

  it.each([
    ['Temperature: 21.5', 'without a unit'],
    ['Temperature: 21.5 °', 'not one of °C, K or °F'],
    ['Temperature (K): 21.5 °C', 'two different units'],
    ['Temperature: room', 'not a number'],
  ])('does not guess from "%s"', (line, message) => {
    const m = read('x.csv', `${line}\n${DATA}`);
    expect(m.temperature).toBeNull();
    expect(m.notes).toEqual([{ line: 1, message: expect.stringContaining(message) }]);
  });

  it('ignores ambient and room temperatures: they are not the sample\'s', () => {
    expect(read('x.csv', `Ambient temperature: 23 °C\nRoom temp: 22 C\n${DATA}`).temperature).toBeNull();
  });
});

describe('readExportMetadata: instrument and date', () => {
  it('reads a long tab-separated metadata block before the data', () => {
    const block = [
      'Instrument\tInvented IA-200',
      ...Array.from({ length: 58 }, (_, i) => `Setting ${i}\t${i}`),
      'Date\t2026-11-30',
      'Time\t14:05:09',
      'freq_hz\tz_real_ohm\tneg_z_imag_ohm',
      '1000\t12.5\t3.1',
      '100\t13.5\t4.1',
    ].join('\r\n');
    const m = read('x.tsv', block);
    expect(m.instrument).toEqual({ text: 'Invented IA-200', line: 1 });
    expect(m.measuredAt).toEqual({ text: '2026-11-30 14:05:09', line: 60, iso: '2026-11-30T14:05:09' });
  });

  it.each([
    ['Date/Time: 2026-11-30T14:05:00Z', '2026-11-30T14:05:00Z'],
    ['Measured at: 2026-11-30 14:05 +0100', '2026-11-30T14:05:00+01:00'],
    ['Timestamp=2026/11/30 08:00:00', '2026-11-30T08:00:00'],
    ['Date: 2026-11-30', '2026-11-30'],
    ['Date: 30/11/2026', null],
    ['Date: 11.12.2026', null],
    ['Date: 2026-02-30', null],
  ])('%s → %s', (line, iso) => {
    expect(read('x.csv', `${line}\n${DATA}`).measuredAt).toMatchObject({ iso, line: 1 });
  });

  it('splits several statements on one line and keeps the first of each kind', () => {
    const m = read('x.csv', `# Instrument: Bench analyser 1 (demo) (Invented IA-200)\n# Sample: OP-8MJA-4T  Replicate: 1  Temperature: 19 C\n# Temperature: 25 C\n${DATA}`);
    expect(m.instrument?.text).toBe('Bench analyser 1 (demo) (Invented IA-200)');
    expect(m.temperature).toMatchObject({ celsius: 19, line: 2 });
    const single = read('x.csv', `Sample: OP-8MJA-4T Replicate: 1 Temperature: 19.5 C Date: 2026-11-30 Time: 14:05\n${DATA}`);
    expect(single).toMatchObject({ sample: { codes: ['OP-8MJA-4T'] }, temperature: { celsius: 19.5 }, measuredAt: { iso: '2026-11-30T14:05:00' } });
  });
});

describe('readExportMetadata: hostile input', () => {
  it('stops looking after maxLines when no data block comes', () => {
    const text = `${'x: y\n'.repeat(10_000)}Sample: OP-8MJA-4T\n`;
    expect(readExportMetadata('x', text, { codePattern: CODE, maxLines: 100 }).sample).toBeNull();
  });

  it('survives NUL bytes, a byte-order mark and an empty file', () => {
    expect(read('a\u0000.csv', '\uFEFFSample: OP-8MJA-4T\u0000\n' + DATA).sample?.codes).toEqual(['OP-8MJA-4T']);
    expect(read('b.csv', '\uFEFFSample: OP-8MJA-4T\n' + DATA).sample?.codes).toEqual(['OP-8MJA-4T']);
    expect(read('', '')).toMatchObject({ sample: null, fileNameCodes: [] });
  });
});
