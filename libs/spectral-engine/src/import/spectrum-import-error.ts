/**
 * A file that cannot be read as a spectrum. `line` and `column` are 1-based as an editor counts
 * them (the column is the character where the offending cell starts); `message` leads with the
 * place, `reason` is the same text without it.
 */
export class SpectrumImportError extends Error {
  override readonly name = 'SpectrumImportError';
  constructor(
    readonly reason: string,
    readonly line?: number,
    readonly column?: number,
  ) {
    super(line === undefined ? reason : column === undefined ? `line ${line}: ${reason}` : `line ${line}, column ${column}: ${reason}`);
  }
}
