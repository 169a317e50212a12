/** What a column holds. `negativeImaginary` is −Z″; `negativePhase` is −φ. */
export type ColumnRole = 'frequency' | 'real' | 'imaginary' | 'negativeImaginary' | 'modulus' | 'phase' | 'negativePhase';

export type FrequencyUnit = 'mHz' | 'Hz' | 'kHz' | 'MHz';
export type ImpedanceUnit = 'mΩ' | 'Ω' | 'kΩ' | 'MΩ';
export type PhaseUnit = 'deg' | 'rad';

/** Caller's word on what the header leaves open. Everything is optional. */
export interface ImportOptions {
  /**
   * Columns by role: a 1-based column number, or the header text of the column. Given columns
   * replace what the header says; with `frequency` and a complete shape given by number, a file
   * needs no header row at all.
   */
  readonly columns?: Partial<Record<ColumnRole, number | string>>;
  /** Units for columns whose header names none (or to replace what it names). */
  readonly units?: { readonly frequency?: FrequencyUnit; readonly impedance?: ImpedanceUnit; readonly phase?: PhaseUnit };
  /** Cell separator; default: found from the file (tab, then semicolon, then comma). */
  readonly delimiter?: '\t' | ';' | ',';
  /** Fewest data rows accepted; default 5. */
  readonly minPoints?: number;
}
