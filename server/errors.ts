/** An error with an HTTP status and a code the client can switch on; its message is shown to people. */
export class HttpError extends Error {
  constructor(
    public status: number,
    public code: string,
    message: string,
    public fields?: Record<string, string>,
    /** More top-level members of the error body, beside `error` (e.g. `shortfalls`). */
    public extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: Record<string, string>, code = 'validation') =>
  new HttpError(400, code, message, fields);
export const unauthenticated = (message = 'Sign in to continue.') => new HttpError(401, 'unauthenticated', message);
export const forbidden = (message = 'Your role does not allow this.') => new HttpError(403, 'forbidden', message);
export const notFound = (what = 'That record') => new HttpError(404, 'not_found', `${what} was not found.`);
export const conflict = (message: string, code = 'conflict', fields?: Record<string, string>) =>
  new HttpError(409, code, message, fields);
