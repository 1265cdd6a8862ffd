/** The one error type services throw; the error middleware maps it to its status. */
export class AppError extends Error {
  constructor(
    readonly code: string,
    message: string,
    readonly status = 400,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export const notFound = (what: string) => new AppError('not_found', `${what} was not found.`, 404);
export const forbidden = (message = 'Your role does not allow this.') => new AppError('forbidden', message, 403);
export const unauthenticated = () => new AppError('unauthenticated', 'Please sign in first.', 401);
