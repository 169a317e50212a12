import { fieldInWords } from './field-words';
import { ROLE_LABELS, ROLES, rolesInWords } from './roles';
import { SAMPLE_STATES, SAMPLE_STATE_LABELS, sampleStateInWords } from './lab/sample-state';

describe('codes in words', () => {
  it.each([
    ['arrivedAt', 'arrival time'],
    ['temperatureC', 'temperature (°C)'],
    ['claimedLot', 'lot claimed'],
    ['firstAdmin.email', 'first admin, email'],
    ['samples.0.description.labelText', 'samples 1, description, label text'],
    ['storageLocation', 'storage location'],
    ['reason', 'reason'],
    ['(root)', '(root)'],
  ])('reads the field %s as “%s”', (field, words) => {
    expect(fieldInWords(field)).toBe(words);
  });

  it('reads roles as a sentence does', () => {
    expect(rolesInWords(['client-admin'])).toBe('client admin');
    expect(rolesInWords(['lab-admin', 'analyst', 'reviewer'])).toBe('lab admin, analyst and reviewer');
    expect(rolesInWords([])).toBe('');
  });

  it('has words for every role and every sample state, none of them a code', () => {
    for (const role of ROLES) expect(ROLE_LABELS[role]).toMatch(/^[A-Z][a-z]+( [a-z]+)*$/);
    for (const state of SAMPLE_STATES) expect(SAMPLE_STATE_LABELS[state]).toMatch(/^[A-Z][a-z]+( [a-z]+)*$/);
    expect(sampleStateInWords('returned-for-rework')).toBe('returned for rework');
  });
});
