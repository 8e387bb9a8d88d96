/**
 * Where in the input a problem was found: 1-based line and column, 1-based group, element and
 * square numbers (as in the messages); `edges` are 0-based edge indices of a drawing.
 */
export interface InputLocation {
  line?: number;
  column?: number;
  group?: number;
  element?: number;
  square?: number;
  /** for drawings: the two edges (0-based indices) that cross */
  edges?: [number, number];
}

/**
 * Every rejection of outside input by the tiling engine. `code` is a stable machine-readable
 * reason; `message` says what is wrong and where.
 */
export class TilingInputError extends Error {
  readonly code: string;
  readonly where?: InputLocation;

  constructor(code: string, message: string, where?: InputLocation) {
    super(message);
    this.name = 'TilingInputError';
    this.code = code;
    if (where) this.where = where;
  }
}
