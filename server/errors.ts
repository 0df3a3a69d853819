/** The server's one error type: a code for programs, a status for HTTP, a message for people. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const notFound = (what: string) => new AppError(404, 'not_found', `${what} was not found.`);
export const unauthorised = () => new AppError(401, 'unauthorised', 'Sign in to continue.');
export const forbidden = (why = 'Your role in this lab does not allow this.') => new AppError(403, 'forbidden', why);
