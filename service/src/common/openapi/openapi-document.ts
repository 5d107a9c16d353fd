import type { INestApplication } from '@nestjs/common';
import { DocumentBuilder, SwaggerModule, type OpenAPIObject } from '@nestjs/swagger';
import { applyAnswerDecorators, ERROR_DESCRIPTIONS, schemaRef, type ErrorStatus } from './api-answer.decorator.js';
import { sharedSchemas } from './shared-schemas.generated.js';

type Operation = NonNullable<OpenAPIObject['paths'][string]['get']>;
const METHODS = ['get', 'put', 'post', 'delete', 'patch'] as const;

/** Every operation of the description, as `METHOD /path` with its operation object. */
export function operationsOf(doc: OpenAPIObject): { method: (typeof METHODS)[number]; path: string; op: Operation }[] {
  return Object.entries(doc.paths).flatMap(([path, item]) =>
    METHODS.filter((m) => item[m]).map((method) => ({ method, path, op: item[method]! })),
  );
}

/** Success answers of an operation that say what they carry: a body with a schema, or 204 with none. */
export function documentedSuccess(op: Operation): string[] {
  return Object.entries(op.responses ?? {})
    .filter(([status]) => /^2\d\d$/.test(status))
    .filter(([status, r]) => {
      const content = r && 'content' in r ? r.content : undefined;
      if (status === '204') return !content || Object.keys(content).length === 0;
      return !!content && Object.keys(content).length > 0 && Object.values(content).every((c) => !!c.schema);
    })
    .map(([status]) => status);
}

/** Operations whose success answer is not documented (the contract test fails on any). */
export function undocumentedOperations(doc: OpenAPIObject): string[] {
  return operationsOf(doc)
    .filter(({ op }) => documentedSuccess(op).length === 0)
    .map(({ method, path }) => `${method.toUpperCase()} ${path}`);
}

function addError(op: Operation, status: ErrorStatus): void {
  op.responses ??= {};
  const existing = op.responses[String(status)];
  const content = { 'application/json': { schema: schemaRef('ApiError') } };
  if (!existing) op.responses[String(status)] = { description: ERROR_DESCRIPTIONS[status], content };
  // A route's own description of the error (ApiBadRequestResponse) keeps its words and gets the error shape.
  else if (!('$ref' in existing) && !existing.content) existing.content = content;
}

/**
 * The OpenAPI 3.1 description of the API: Nest's routes and request DTOs, answer shapes from shared-types
 * (shared-schemas.generated.ts), and the error answers every route can give: 400 where it takes input,
 * 401 and 403 where it needs a sign-in or a logger key, 404 where the path names a record, 409 on writes that
 * touch stored records, 413 where it takes a body, 415 where it takes an upload, 429 on the sign-in routes;
 * 422 and any other a route adds with @ApiErrors.
 */
export function buildApiDocument(app: INestApplication): OpenAPIObject {
  applyAnswerDecorators();
  const doc = SwaggerModule.createDocument(
    app,
    new DocumentBuilder()
      .setOpenAPIVersion('3.1.0')
      .setTitle('Crankjournal API')
      .setDescription(
        'Run logbook, start gate, alarms and engineering calculations for a historic steam mill engine. ' +
          'Every answer shape is a shared-types type (components/schemas); every error answer is an ApiError. ' +
          'Live events (socket.io, path /socket.io) are described in the README, section "Live events".',
      )
      .setVersion('0.1.0')
      .addBearerAuth()
      .addApiKey({ type: 'apiKey', in: 'header', name: 'x-logger-key' }, 'logger-key')
      .build(),
  );
  doc.components ??= {};
  // A request class named like a shared type (e.g. ConsumptionEntryDto) keeps its own schema as `<name>Body`;
  // request bodies and the classes' own schemas point there, answers point at the shared type.
  const own = doc.components.schemas ?? {};
  for (const name of Object.keys(own).filter((n) => n in sharedSchemas)) {
    const from = `"#/components/schemas/${name}"`;
    const to = `"#/components/schemas/${name}Body"`;
    const rewrite = <T>(node: T): T => JSON.parse(JSON.stringify(node).split(from).join(to)) as T;
    own[`${name}Body`] = own[name];
    delete own[name];
    for (const key of Object.keys(own)) own[key] = rewrite(own[key]);
    for (const { op } of operationsOf(doc)) {
      if (op.requestBody) op.requestBody = rewrite(op.requestBody);
      if (op.parameters) op.parameters = rewrite(op.parameters);
    }
  }
  doc.components.schemas = { ...own, ...(sharedSchemas as NonNullable<typeof doc.components.schemas>) };
  for (const { method, path, op } of operationsOf(doc)) {
    const takesInput = !!op.requestBody || (op.parameters ?? []).length > 0;
    const bodyTypes = Object.keys(op.requestBody && 'content' in op.requestBody ? (op.requestBody.content ?? {}) : {});
    // Every write that touches stored records can meet a state that does not allow it (a closed run, a signed
    // checklist) or a record that already exists (a unique key): 409. The stateless calculators and sign-in store nothing.
    const stateless = path.startsWith('/api/calculations/') || path === '/api/auth/login' || path === '/api/auth/refresh';
    if (method !== 'get' && !stateless) addError(op, 409);
    // Every body passes a size limit (JSON and uploads alike); an upload is judged by its content.
    if (bodyTypes.length) addError(op, 413);
    if (bodyTypes.some((t) => t !== 'application/json')) addError(op, 415);
    if (takesInput) addError(op, 400);
    if ((op.security ?? []).length > 0) {
      addError(op, 401);
      addError(op, 403);
    }
    if (path.includes('{id}') || /\{\w+Id\}/.test(path)) addError(op, 404);
    if (path === '/api/auth/login' || path === '/api/auth/refresh') addError(op, 429);
  }
  return doc;
}
