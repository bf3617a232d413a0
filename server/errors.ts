/** An error that knows its HTTP status and stable snake_case code. Only the error handler renders it. */
export class HttpError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = "HttpError";
  }
}

export const ValidationError = (message: string, fields?: Record<string, string>) =>
  new HttpError(400, "validation_error", message, fields);
export const AuthenticationError = (message = "Sign in to continue.") => new HttpError(401, "authentication_required", message);
export const ForbiddenError = (message = "Your role in this production does not allow that.") => new HttpError(403, "forbidden", message);
export const NotFoundError = (message = "Not found.") => new HttpError(404, "not_found", message);
export const ConflictError = (message: string, fields?: Record<string, string>) => new HttpError(409, "conflict", message, fields);
export const PayloadTooLargeError = (message = "The file is too large.", fields?: Record<string, string>) =>
  new HttpError(413, "payload_too_large", message, fields);
export const UnsupportedMediaTypeError = (message: string, fields?: Record<string, string>) =>
  new HttpError(415, "unsupported_media_type", message, fields);
export const UnprocessableError = (message: string, fields?: Record<string, string>) =>
  new HttpError(422, "unprocessable", message, fields);
/** The server's worker pool has a full queue; the client may try again shortly. */
export const ServerBusyError = (message = "The server is busy with other large files; try again in a minute.") =>
  new HttpError(503, "server_busy", message);
export const TooManyRequestsError = (message: string) => new HttpError(429, "too_many_requests", message);
export const DatabaseUnavailableError = (
  message = "The database is not reachable right now. Nothing was changed; try again in a moment.",
) => new HttpError(503, "database_unavailable", message);
