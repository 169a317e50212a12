/** A lab-defined model expression that cannot be used, with the offending token when there is one. */
export class ModelDefinitionError extends Error {
  override readonly name = 'ModelDefinitionError';
  constructor(
    message: string,
    /** The token at fault, as written. */
    readonly token?: string,
    /** 1-based character position of the token in the expression. */
    readonly position?: number,
  ) {
    super(message);
  }
}
