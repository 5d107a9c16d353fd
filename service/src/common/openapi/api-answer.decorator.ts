import { HttpStatus, RequestMethod } from '@nestjs/common';
import { HTTP_CODE_METADATA, METHOD_METADATA } from '@nestjs/common/constants.js';
import { ApiResponse } from '@nestjs/swagger';
import type { SharedSchemaName } from './shared-schemas.generated.js';

/**
 * How a route documents its answers in the OpenAPI description (served at /api/docs-json):
 *   @ApiAnswer('RunDetail')                 a JSON body of the shared-types type RunDetail
 *   @ApiAnswer('RunSummary', { array: true })
 *   @ApiFileAnswer('text/csv')              a download (CSV, PDF, an image)
 *   @ApiNoContent()                         204, no body
 *   @ApiErrors(404, 409)                    error answers beyond the ones every route gets (see openapi-document.ts)
 * The success status follows the route itself (@HttpCode, else 201 for POST and 200 for the rest), whatever
 * the order of the decorators. Shapes are named by shared-types type (a typo fails the type check); their
 * schemas come from shared-schemas.generated.ts only.
 */
export interface AnswerOptions {
  array?: boolean;
  /** `true` when the route may answer `null` instead (e.g. "no open run"). */
  nullable?: boolean;
  description?: string;
  /** A sample answer shown on the docs page. */
  example?: unknown;
}

export const schemaRef = (name: SharedSchemaName) => ({ $ref: `#/components/schemas/${name}` });

type Pending = { target: object; key: string | symbol; descriptor: PropertyDescriptor; content: (status: number) => object };
const pending: Pending[] = [];

function successStatus(handler: object): number {
  const code = Reflect.getMetadata(HTTP_CODE_METADATA, handler) as number | undefined;
  if (code) return code;
  return Reflect.getMetadata(METHOD_METADATA, handler) === RequestMethod.POST ? HttpStatus.CREATED : HttpStatus.OK;
}

function deferred(content: Pending['content']): MethodDecorator {
  return (target, key, descriptor) => {
    pending.push({ target, key, descriptor, content });
  };
}

/** Applies every answer decorator once the routes' own decorators are all in place (before the document is built). */
export function applyAnswerDecorators(): void {
  for (const p of pending.splice(0)) {
    const status = successStatus(p.descriptor.value as object);
    ApiResponse({ status, ...p.content(status) } as Parameters<typeof ApiResponse>[0])(p.target, p.key, p.descriptor);
  }
}

/** The route answers a JSON body of the shared-types type `name`. */
export function ApiAnswer(name: SharedSchemaName, opts: AnswerOptions = {}): MethodDecorator {
  let schema: Record<string, unknown> = opts.array ? { type: 'array', items: schemaRef(name) } : schemaRef(name);
  if (opts.nullable) schema = { oneOf: [schema, { type: 'null' }] };
  return deferred(() => ({
    description: opts.description ?? (opts.array ? `A list of ${name}` : name),
    content: { 'application/json': { schema, ...(opts.example === undefined ? {} : { example: opts.example }) } },
  }));
}

/** The route answers a JSON body of an inline schema (for the few answers that have no shared type). */
export function ApiAnswerSchema(schema: Record<string, unknown>, description: string): MethodDecorator {
  return deferred(() => ({ description, content: { 'application/json': { schema } } }));
}

export type FileContentType = 'text/csv' | 'application/pdf' | 'image/png' | 'image/jpeg' | 'image/*' | 'application/octet-stream';

/** The route answers a file: CSV, PDF, an image or any stored attachment. */
export function ApiFileAnswer(contentType: FileContentType | FileContentType[], description = 'A file'): MethodDecorator {
  const types = Array.isArray(contentType) ? contentType : [contentType];
  const schema = (t: string) => (t === 'text/csv' ? { type: 'string' } : { type: 'string', format: 'binary' });
  return deferred(() => ({ description, content: Object.fromEntries(types.map((t) => [t, { schema: schema(t) }])) }));
}

/** The route answers with no body (204). */
export function ApiNoContent(description = 'Done; no body'): MethodDecorator {
  return (target, key, descriptor) => ApiResponse({ status: HttpStatus.NO_CONTENT, description })(target, key, descriptor);
}

export type ErrorStatus = 400 | 401 | 403 | 404 | 409 | 413 | 415 | 422 | 429;

export const ERROR_DESCRIPTIONS: Record<ErrorStatus, string> = {
  400: 'Bad request: the body, query or path failed validation (the message says which field and why)',
  401: 'Not signed in, or the access token (or logger key) is missing, expired or revoked',
  403: 'Signed in, but the role may not do this',
  404: 'Nothing with that id',
  409: 'Conflicts with the current state (e.g. a run in the wrong state, a duplicate, a stale version)',
  413: 'The body or upload is too large',
  415: 'The upload is not of an accepted type',
  422: 'Well-formed but refused by a rule (e.g. the start gate, a calculation outside its valid range)',
  429: 'Too many attempts; wait and try again',
};

/** Error answers (all with the one ApiError shape) a route can give beyond those added to every route. */
export function ApiErrors(...statuses: ErrorStatus[]): MethodDecorator {
  return (target, key, descriptor) => {
    for (const status of statuses) {
      ApiResponse({
        status,
        description: ERROR_DESCRIPTIONS[status],
        content: { 'application/json': { schema: schemaRef('ApiError') } },
      } as Parameters<typeof ApiResponse>[0])(target, key, descriptor);
    }
  };
}
