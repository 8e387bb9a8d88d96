/**
 * The error every public entry of the puzzle engine throws for bad input. `code` is
 * stable (for API answers and tests); `where` names the offending field when there is one.
 */
export class PuzzleInputError extends Error {
  readonly code: string;
  readonly where?: { field: string; index?: number };

  constructor(code: string, message: string, where?: { field: string; index?: number }) {
    super(message);
    this.name = 'PuzzleInputError';
    this.code = code;
    if (where) this.where = where;
  }
}
