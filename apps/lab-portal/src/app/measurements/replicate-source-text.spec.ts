import type { Replicate } from '@ohmprint/contracts';
import { identityLook, readCode, readTemperature } from './replicate-source-text';

const base = { temperatureC: 19, temperatureSource: 'file', declared: null } as unknown as Replicate;
const declared = (over: Partial<NonNullable<Replicate['declared']>>): NonNullable<Replicate['declared']> => ({
  fileNameCodes: ['OP-8MJA-4T'],
  sample: { text: 'OP-8MJA-4T', line: 3, codes: ['OP-8MJA-4T'] },
  temperature: { text: '19 C', line: 3, value: 19, unit: 'degC', celsius: 19 },
  instrument: null,
  measuredAt: null,
  notes: [],
  identity: 'matches',
  otherCodes: [],
  identityReason: null,
  temperatureReason: null,
  ...over,
});

describe('what a replicate’s file said, in words', () => {
  it('names where each code was read', () => {
    expect(readCode({ ...base, declared: declared({}) })).toBe('OP-8MJA-4T (file name, line 3)');
    expect(readCode({ ...base, declared: declared({ fileNameCodes: [], sample: { text: 'tank 3', line: 2, codes: [] } }) })).toBe('“tank 3” (line 2; no sample code)');
    expect(readCode(base)).toMatch(/^not read/);
  });

  it('says plainly when a file names another sample and why it was kept', () => {
    const kept = identityLook({ ...base, declared: declared({ identity: 'other-sample-confirmed', otherCodes: ['OP-8MJA-4T'], identityReason: 'Cup relabelled' }) });
    expect(kept).toEqual({ icon: 'warning', text: 'Names OP-8MJA-4T; kept by the analyst: Cup relabelled', tone: 'warn' });
    expect(identityLook({ ...base, declared: declared({}) }).text).toBe('Matches this sample');
    expect(identityLook(base).text).toBe('Not checked');
  });

  it('says where the temperature came from', () => {
    expect(readTemperature({ ...base, declared: declared({}) })).toBe('19 °C from the file (line 3)');
    const over = { ...base, temperatureC: 20, temperatureSource: 'entered-over-file', declared: declared({ temperatureReason: 'probe reads low' }) } as Replicate;
    expect(readTemperature(over)).toBe('20 °C entered; the file states 19 °C (line 3). Reason: probe reads low');
    expect(readTemperature({ ...base, temperatureC: 21, temperatureSource: 'entered', declared: declared({ temperature: null }) })).toBe('21 °C entered; the file states none');
  });
});
