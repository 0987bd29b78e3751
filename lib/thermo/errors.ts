/**
 * A refusal: the request cannot be computed meaningfully. The route handler maps it to
 * HTTP 422 `{ error: { code, message, details } }`, the CLI to exit 2.
 */
export class EngineRefusal extends Error {
  readonly code: string;
  readonly details?: unknown;

  constructor(code: string, message: string, details?: unknown) {
    super(message);
    this.name = "EngineRefusal";
    this.code = code;
    if (details !== undefined) this.details = details;
  }

  toJSON(): { code: string; message: string; details?: unknown } {
    return this.details === undefined ? { code: this.code, message: this.message } : { code: this.code, message: this.message, details: this.details };
  }
}

export function refuse(code: string, message: string, details?: unknown): never {
  throw new EngineRefusal(code, message, details);
}
