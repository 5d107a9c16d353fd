/** The body of every error answer from the API. */
export interface ApiError {
  statusCode: number;
  error: string;
  /** One or more sentences a person can act on. */
  message: string | string[];
  /** Extra structured detail, e.g. the start gate's list of reasons. */
  details?: unknown;
}
export interface HealthResponse {
  status: 'ok' | 'degraded';
  database: 'up' | 'down';
  version: string;
  time: string;
}
export interface Page<T> {
  items: T[];
  total: number;
}
