/** An error with an HTTP status and a stable code the client can switch on. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fieldErrors?: Record<string, string[]>,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const notFound = (what: string, id?: string | number) =>
  new HttpError(404, 'not_found', id === undefined ? `No ${what} here.` : `No ${what} with id ${id}.`);

export const badRequest = (message: string, fieldErrors?: Record<string, string[]>) => new HttpError(400, 'invalid_input', message, fieldErrors);

export const unauthorized = () => new HttpError(401, 'unauthorized', 'Sign in to continue.');

export const forbidden = (message = 'Your role in this organization does not allow this.') => new HttpError(403, 'forbidden', message);
