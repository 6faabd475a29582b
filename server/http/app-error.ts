import type { ErrorDetail } from '../../shared/schemas/error.schema';

/** The one error type routes and services throw; the central handler turns it into the error body. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: ErrorDetail[],
    readonly operational = true,
  ) {
    super(message);
    this.name = 'AppError';
  }

  static badRequest(code: string, message: string, details?: ErrorDetail[]) {
    return new AppError(400, code, message, details);
  }
  static unauthenticated(message = 'Sign in to continue') {
    return new AppError(401, 'unauthenticated', message);
  }
  static forbidden(message = 'Your role does not allow this') {
    return new AppError(403, 'forbidden', message);
  }
  static notFound(what = 'Record') {
    return new AppError(404, 'not_found', `${what} not found`);
  }
  static conflict(code: string, message: string, details?: ErrorDetail[]) {
    return new AppError(409, code, message, details);
  }
  static unprocessable(code: string, message: string, details?: ErrorDetail[]) {
    return new AppError(422, code, message, details);
  }
}
