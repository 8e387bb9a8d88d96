/** Every rejection of a bad request by the foundry; `code` is a stable machine-readable reason. */
export class FoundryInputError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = 'FoundryInputError';
    this.code = code;
  }
}
