import type { ApiError } from '@crankjournal/shared-types';

/** An API error with the server's readable message. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiError | null,
  ) {
    super(body ? (Array.isArray(body.message) ? body.message.join('\n') : body.message) : `Request failed (${status})`);
  }
  get messages(): string[] {
    if (!this.body) return [this.message];
    return Array.isArray(this.body.message) ? this.body.message : [this.body.message];
  }
}
/** The server could not be reached (offline, or stopped). */
export class NetworkError extends Error {}

/** The HttpError of a response that is not ok, with the server's message when it sent one. */
export async function httpErrorOf(res: Response): Promise<HttpError> {
  let parsed: ApiError | null = null;
  try {
    parsed = (await res.json()) as ApiError;
  } catch {
    /* not JSON */
  }
  return new HttpError(res.status, parsed);
}
