import { toLocalInput } from './local-time';

describe('toLocalInput', () => {
  it('writes local wall-clock time that the datetime-local field reads back as the same instant', () => {
    const d = new Date(2026, 11, 2, 9, 5, 41);
    expect(toLocalInput(d)).toBe('2026-12-02T09:05');
    expect(new Date(toLocalInput(d)).getTime()).toBe(new Date(2026, 11, 2, 9, 5).getTime());
  });
});
