import { rejectionText } from './rejection-text';

describe('rejectionText', () => {
  it('names the file, line and column before the message', () => {
    expect(rejectionText({ fileName: 'rep3.csv', line: 14, column: 2, message: 'expected a number, found "n/a"' })).toBe(
      'rep3.csv, line 14, column 2: expected a number, found "n/a"',
    );
  });

  it('leaves out what the parser could not place', () => {
    expect(rejectionText({ fileName: 'empty.txt', line: null, column: null, message: 'the file holds no data rows' })).toBe('empty.txt: the file holds no data rows');
  });
});
