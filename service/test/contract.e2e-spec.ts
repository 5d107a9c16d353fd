/**
 * The API contract: the OpenAPI description (/api/docs-json) says what every operation answers, and the
 * live answers keep to it. On the demo data (seeded into a database of this test's own), every GET route
 * and the main writes are called as a role allowed to call them (test/roles-matrix.table.ts); each answer
 * must have a documented status and content type, and a JSON answer must validate against its documented
 * schema (ajv, JSON Schema 2020-12 as OpenAPI 3.1 uses, with formats): a missing required field or a field
 * the description does not know fails. An operation that documents no success answer fails too, so a route
 * added without @ApiAnswer / @ApiFileAnswer / @ApiNoContent is caught here. Common practice, no source.
 */
import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Ajv2020, type ValidateFunction } from 'ajv/dist/2020.js';
import addFormats from 'ajv-formats';
import pg from 'pg';
import { getMetadataStorage } from 'class-validator';
import { ROUTE_ARGS_METADATA } from '@nestjs/common/constants.js';
import { RouteParamtypes } from '@nestjs/common/enums/route-paramtypes.enum.js';
import { ModulesContainer } from '@nestjs/core';
import type { OpenAPIObject } from '@nestjs/swagger';
import type { Role } from '@crankjournal/shared-types';
import { operationsOf, undocumentedOperations } from '../src/common/openapi/openapi-document.js';
import { drawIndicatorCard } from '../src/database/seeds/card-image.js';
import { applyTestEnv, clusterAdminConfig, startTestApp, type TestApp } from './utils/test-app.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { requestAs } from './utils/signed-in.js';
import { createEngine } from './factories/engine.factory.js';
import { ROUTE_ACCESS } from './roles-matrix.table.js';

const CONTRACT_DB = 'crankjournal_contract';

let t: TestApp;
let doc: OpenAPIObject;
const sessions = new Map<Role, SignedIn>();
const ajv = new Ajv2020({ strict: false, allErrors: true });
(addFormats as unknown as (a: Ajv2020) => void)(ajv);
const validators = new Map<string, ValidateFunction>();

/** A database of this file's own, so the demo data does not meet the other suites' data. */
async function freshContractDatabase(): Promise<string> {
  applyTestEnv();
  const base = new URL(process.env.DATABASE_URL!);
  const admin = new pg.Client(clusterAdminConfig(base.toString()));
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS ${CONTRACT_DB} WITH (FORCE)`);
    await admin.query(`CREATE DATABASE ${CONTRACT_DB} OWNER ${decodeURIComponent(base.username)}`);
  } finally {
    await admin.end();
  }
  base.pathname = `/${CONTRACT_DB}`;
  return base.toString();
}

async function as(role: Role): Promise<SignedIn> {
  if (!sessions.has(role)) sessions.set(role, await login(t, role));
  return sessions.get(role)!;
}

/** The first role the roles matrix allows on `METHOD /api/path/{id}` (undefined for public routes). */
function allowedRole(method: string, path: string): Role | undefined {
  const key = `${method.toUpperCase()} ${path.replace(/\{(\w+)\}/g, ':$1')}`;
  const access = ROUTE_ACCESS[key];
  if (access === undefined) throw new Error(`${key} has no row in test/roles-matrix.table.ts`);
  if (access === 'public' || access === 'logger-key') return undefined;
  return access.includes('chief_engineer') ? 'chief_engineer' : access[0];
}

function validatorFor(schema: object): ValidateFunction {
  const key = JSON.stringify(schema);
  let v = validators.get(key);
  if (!v) {
    v = ajv.compile({ ...schema, components: doc.components });
    validators.set(key, v);
  }
  return v;
}

type Answer = { status: number; headers: Record<string, string>; body: unknown; text?: string };

/** Checks one live answer against the operation's documented answers; returns the problems found. */
function check(method: string, path: string, res: Answer): string[] {
  const op = doc.paths[path]?.[method as 'get'];
  if (!op) return [`${method.toUpperCase()} ${path} is not in the description`];
  const documented = op.responses?.[String(res.status)];
  const where = `${method.toUpperCase()} ${path} → ${res.status}`;
  if (!documented) return [`${where}: status not documented (${JSON.stringify(res.body).slice(0, 200)})`];
  if (res.status === 204) return [];
  const content = ('content' in documented ? documented.content : undefined) ?? {};
  const type = (res.headers['content-type'] ?? '').split(';')[0].trim();
  const entry =
    content[type] ??
    Object.entries(content).find(([k]) => k.endsWith('/*') && type.startsWith(k.slice(0, -1)))?.[1] ??
    content['application/octet-stream'];
  if (!entry) return [`${where}: content type ${type} not documented (${Object.keys(content).join(', ')})`];
  if (type !== 'application/json') return [];
  const validate = validatorFor(entry.schema as object);
  if (validate(res.body)) return [];
  return [`${where}: ${ajv.errorsText(validate.errors, { separator: '\n    ' })}`];
}

async function call(method: 'get' | 'post' | 'put' | 'patch' | 'delete', path: string, real: string, body?: unknown): Promise<Answer> {
  const role = allowedRole(method, path);
  let req = requestAs(t, role ? await as(role) : undefined)[method](real);
  if (body !== undefined) req = req.send(body as object);
  const res = await req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
  const raw = res.body as Buffer;
  const type = String(res.headers['content-type'] ?? '');
  const parsed = type.startsWith('application/json') && raw.length ? (JSON.parse(raw.toString('utf8')) as unknown) : raw;
  return { status: res.status, headers: res.headers as Record<string, string>, body: parsed };
}

const getJson = async <T>(path: string, role: Role = 'chief_engineer'): Promise<T> => {
  const res = await requestAs(t, await as(role)).get(path);
  if (res.status !== 200) throw new Error(`GET ${path} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body as T;
};
type WithId = { id: string };

beforeAll(async () => {
  process.env.DATABASE_URL = await freshContractDatabase();
  t = await startTestApp();
  const { seedDemo } = await import('../src/database/seeds/seed-demo.js');
  await seedDemo(t.app);
  doc = (await t.http.get('/api/docs-json').expect(200)).body as OpenAPIObject;
}, 600_000);

afterAll(async () => {
  await t?.close();
});

describe('the OpenAPI description', () => {
  it('is OpenAPI 3.1 and documents a success answer for every operation', () => {
    expect(doc.openapi).toBe('3.1.0');
    expect(operationsOf(doc).length).toBeGreaterThan(100);
    expect(undocumentedOperations(doc)).toEqual([]);
  });

  it('documents the one error shape on every operation that takes input or a sign-in', () => {
    const missing = operationsOf(doc)
      .filter(({ op }) => (op.security ?? []).length > 0)
      .filter(({ op }) => !op.responses?.['401'] || !op.responses?.['403'])
      .map(({ method, path }) => `${method} ${path}`);
    expect(missing).toEqual([]);
    expect(doc.paths['/api/runs/{id}']?.get?.responses?.['404']).toMatchObject({
      content: { 'application/json': { schema: { $ref: '#/components/schemas/ApiError' } } },
    });
  });

  it('the committed generated client (test/contract/openapi-client.generated.ts) is that of this description', () => {
    const dir = mkdtempSync(join(tmpdir(), 'contract-'));
    writeFileSync(join(dir, 'openapi.json'), JSON.stringify(doc));
    const bin = join(process.cwd(), '..', 'node_modules', 'openapi-typescript', 'bin', 'cli.js');
    execFileSync(process.execPath, [bin, join(dir, 'openapi.json'), '-o', join(dir, 'client.ts')], { stdio: 'pipe', timeout: 60_000 });
    const fresh = readFileSync(join(dir, 'client.ts'), 'utf8');
    const committed = readFileSync(join(process.cwd(), 'test', 'contract', 'openapi-client.generated.ts'), 'utf8');
    // On a difference: npm run openapi:client -w service (DEVELOPERS.md, "API description").
    expect(committed === fresh).toBe(true);
  });

  it('the README documents every live event of shared-types', () => {
    const events = readFileSync(join(process.cwd(), '..', 'shared-types', 'src', 'events', 'live-events.ts'), 'utf8');
    const names = [...events.matchAll(/^\s+'([a-z]+:[a-z]+)':/gm)].map((m) => m[1]);
    const readme = readFileSync(join(process.cwd(), '..', 'README.md'), 'utf8');
    expect(names.length).toBeGreaterThan(5);
    expect(names.filter((n) => !readme.includes(`\`${n}\``))).toEqual([]);
  });

  it('describes every query parameter a route accepts (name, type and words), from its query DTO', () => {
    // The routes' query DTOs, found as Nest finds them: a @Query() argument's class and its validated fields.
    const storage = getMetadataStorage();
    const verbs: Record<number, string> = { 0: 'get', 1: 'post', 2: 'put', 3: 'delete', 4: 'patch' };
    const expected: string[] = [];
    for (const mod of t.app.get(ModulesContainer).values())
      for (const wrapper of mod.controllers.values()) {
        const ctrl = wrapper.metatype as (new (...a: unknown[]) => object) | null;
        if (!ctrl) continue;
        const base = String(Reflect.getMetadata('path', ctrl) ?? '');
        for (const name of Object.getOwnPropertyNames(ctrl.prototype)) {
          const handler = (ctrl.prototype as Record<string, unknown>)[name];
          if (name === 'constructor' || typeof handler !== 'function') continue;
          const args = (Reflect.getMetadata(ROUTE_ARGS_METADATA, ctrl, name) ?? {}) as Record<string, { index: number; data?: string }>;
          const types = (Reflect.getMetadata('design:paramtypes', ctrl.prototype, name) ?? []) as (new () => object)[];
          const sub = String(Reflect.getMetadata('path', handler) ?? '');
          const path = `/api/${[base, sub].filter(Boolean).join('/')}`
            .replace(/\/+/g, '/')
            .replace(/:(\w+)/g, '{$1}')
            .replace(/\/$/, '');
          const verb = verbs[Reflect.getMetadata('method', handler) as number];
          for (const [key, arg] of Object.entries(args)) {
            if (Number(key.split(':')[0]) !== RouteParamtypes.QUERY || arg.data) continue;
            const fields = new Set(storage.getTargetValidationMetadatas(types[arg.index], '', true, false).map((m) => m.propertyName));
            for (const f of fields) expected.push(`${verb?.toUpperCase()} ${path} ?${f}`);
          }
        }
      }
    expect(expected.length).toBeGreaterThan(20);
    const described = new Set(
      operationsOf(doc).flatMap(({ method, path, op }) =>
        (op.parameters ?? [])
          .filter((x) => 'in' in x && x.in === 'query' && !!x.description && !!x.schema)
          .map((x) => `${method.toUpperCase()} ${path} ?${'name' in x ? x.name : ''}`),
      ),
    );
    expect(expected.filter((e) => !described.has(e))).toEqual([]);
  });

  it('every $ref points at a schema it holds', () => {
    const refs = [...JSON.stringify(doc).matchAll(/"\$ref":"#\/components\/schemas\/([^"]+)"/g)].map((m) => m[1]);
    const missing = [...new Set(refs)].filter((r) => !doc.components?.schemas?.[r]);
    expect(missing).toEqual([]);
  });
});

describe('live answers keep to the description', () => {
  it('every GET route, with ids from the demo data', async () => {
    const engines = await getJson<WithId[]>('/api/engines');
    const runs = await getJson<(WithId & { state: string })[]>('/api/runs');
    const run = runs.find((r) => r.state === 'closed') ?? runs[0];
    const templates = await getJson<WithId[]>('/api/checklist-templates');
    const template = await getJson<{ versions: { version: number }[] }>(`/api/checklist-templates/${templates[0].id}`);
    const withChecklists = [];
    for (const r of runs) {
      const o = await getJson<{ checklists: WithId[] }>(`/api/runs/${r.id}/checklists`);
      if (o.checklists.length) withChecklists.push(o.checklists[0].id);
      if (withChecklists.length) break;
    }
    const millRuns = await getJson<{ runId: string }[]>('/api/mill/runs', 'mill_lead');
    const lots = await getJson<WithId[]>('/api/mill/lots', 'mill_lead');
    let quoteId: string | undefined;
    for (const lot of lots) {
      const quotes = await getJson<WithId[]>(`/api/mill/lots/${lot.id}/quotes`, 'mill_lead');
      if (quotes.length) quoteId = quotes[0].id;
      if (quoteId) break;
    }
    let cardRunId = run.id;
    let cardSetId: string | undefined;
    let cardImageId: string | undefined;
    for (const r of runs) {
      const sets = await getJson<WithId[]>(`/api/runs/${r.id}/card-sets`);
      if (!sets.length) continue;
      cardRunId = r.id;
      cardSetId = sets[0].id;
      const set = await getJson<{ cards: { imageId: string | null }[] }>(`/api/card-sets/${cardSetId}`);
      cardImageId = set.cards.find((c) => c.imageId)?.imageId ?? undefined;
      break;
    }
    const inspections = await getJson<WithId[]>('/api/maintenance/inspections');
    let attachmentId: string | undefined;
    for (const i of inspections) {
      const d = await getJson<{ attachments: WithId[] }>(`/api/maintenance/inspections/${i.id}`);
      attachmentId = d.attachments[0]?.id;
      if (attachmentId) break;
    }
    let photo: string | undefined;
    if (withChecklists[0]) {
      const c = await getJson<{ entries?: { itemKey: string; hasPhoto: boolean }[] }>(`/api/checklists/${withChecklists[0]}`);
      const key = c.entries?.find((e) => e.hasPhoto)?.itemKey;
      if (key) photo = `/api/checklists/${withChecklists[0]}/items/${key}/photo`;
    }
    const first = async (path: string, role?: Role) => (await getJson<WithId[]>(path, role))[0]?.id;
    // The demo's open-day visitor board (switched on by the seed; it has no photo).
    const board = (await getJson<{ id: string; slug: string; hasPhoto: boolean }[]>('/api/visitor-boards', 'chief_engineer'))[0];

    const ids: Record<string, string | undefined> = {
      '/api/engines/{id}': engines[0].id,
      '/api/lubrication/engines/{id}': engines[0].id,
      '/api/runs/{id}': run.id,
      '/api/runs/{runId}': cardRunId,
      '/api/checklist-templates/{id}': templates[0].id,
      '/api/checklists/{id}': withChecklists[0],
      '/api/mill/mills/{id}': await first('/api/mill/mills', 'mill_lead'),
      '/api/mill/schedules/{id}': await first('/api/mill/schedules', 'mill_lead'),
      '/api/mill/runs/{runId}': millRuns[0]?.runId,
      '/api/mill/lots/{id}': lots[0]?.id,
      '/api/payments/lots/{id}': lots[0]?.id,
      '/api/mill/quotes/{id}': quoteId,
      '/api/card-sets/{id}': cardSetId,
      '/api/card-images/{id}': cardImageId,
      '/api/maintenance/bearings/{id}': await first('/api/maintenance/bearings'),
      '/api/maintenance/plans/{id}': await first('/api/maintenance/plans'),
      '/api/maintenance/inspections/{id}': inspections[0]?.id,
      '/api/maintenance/attachments/{id}': attachmentId,
      '/api/maintenance/work-records/{id}': await first('/api/maintenance/work-records'),
      '/api/visit/{slug}': board?.slug,
    };
    const visitPhotos = ['/api/visit/{slug}/photo', '/api/visitor-boards/{id}/photo'];
    const version = String(template.versions[0]?.version ?? 1);
    const queryValues: Record<string, string> = { engineId: engines[0].id, year: String(new Date().getFullYear()) };

    const problems: string[] = [];
    const noData: string[] = [];
    for (const { path } of operationsOf(doc).filter((o) => o.method === 'get')) {
      let real: string | undefined = path;
      if (path === '/api/checklists/{id}/items/{itemKey}/photo') real = photo;
      else if (visitPhotos.includes(path))
        real = board?.hasPhoto ? path.replace('{slug}', board.slug).replace('{id}', board.id) : undefined;
      else if (path.includes('{')) {
        const prefix = Object.keys(ids)
          .filter((p) => path.startsWith(p))
          .sort((a, b) => b.length - a.length)[0];
        const id = prefix ? ids[prefix] : undefined;
        real = id ? path.replace(prefix!, prefix!.replace(/\{\w+\}/, id)).replace('{version}', version) : undefined;
        if (real?.includes('{')) real = undefined;
      }
      if (!real) {
        noData.push(path);
        continue;
      }
      const query = (doc.paths[path].get?.parameters ?? [])
        .filter((q) => 'in' in q && q.in === 'query' && q.required)
        .map((q) => (q as { name: string }).name)
        .map((name) => `${name}=${queryValues[name] ?? ''}`);
      if (query.length) real += `?${query.join('&')}`;
      const res = await call('get', path, real);
      if (res.status >= 400) problems.push(`GET ${real} answered ${res.status}: ${JSON.stringify(res.body).slice(0, 300)}`);
      problems.push(...check('get', path, res));
    }
    expect(problems).toEqual([]);
    // The demo holds no checklist photo, no scanned card image and no visitor board photo; every other GET route is called above.
    expect(noData.sort()).toEqual(
      [
        photo ? undefined : '/api/checklists/{id}/items/{itemKey}/photo',
        cardImageId ? undefined : '/api/card-images/{id}',
        ...(board?.hasPhoto ? [] : visitPhotos),
      ]
        .filter((p) => p !== undefined)
        .sort(),
    );
  });

  it('the main writes: sign-in, a run and its round of readings, a logger and its push, the calculators', async () => {
    const problems: string[] = [];
    const expectOk = async (method: 'post' | 'patch', path: string, real: string, body: unknown, headers: Record<string, string> = {}) => {
      const role = allowedRole(method, path);
      let req = requestAs(t, role ? await as(role) : undefined)[method](real);
      for (const [k, v] of Object.entries(headers)) req = req.set(k, v);
      const res = await req.send(body as object);
      const answer = { status: res.status, headers: res.headers as Record<string, string>, body: res.body as unknown };
      if (res.status >= 300)
        problems.push(`${method.toUpperCase()} ${real} answered ${res.status}: ${JSON.stringify(res.body).slice(0, 300)}`);
      problems.push(...check(method, path, answer));
      return res.body as Record<string, unknown>;
    };
    const example = (path: string) => {
      const content = (doc.paths[path].post?.requestBody as { content: Record<string, { examples?: Record<string, { value: unknown }> }> })
        .content['application/json'];
      return Object.values(content.examples ?? {})[0]?.value;
    };

    // Sign-in, with the example the docs page shows (a demo sign-in).
    await expectOk('post', '/api/auth/login', '/api/auth/login', example('/api/auth/login'));

    // A run of a fresh engine, prepared, and a round of readings by its code (as the docs example does).
    const chief = await as('chief_engineer');
    const engine = await createEngine(t, chief);
    const point = engine.measurementPoints[0];
    const run = await expectOk('post', '/api/runs', '/api/runs', { engineId: engine.id, purpose: 'test', title: 'Contract run' });
    await expectOk('post', '/api/runs/{id}/transitions', `/api/runs/${String(run.id)}/transitions`, { to: 'preparing' });
    const round = await expectOk('post', '/api/runs/{id}/rounds', `/api/runs/${String(run.id)}/rounds`, {
      takenAt: new Date().toISOString(),
      readings: [{ clientId: randomUUID(), pointCode: point.code, value: 20, takenAt: new Date().toISOString() }],
    });
    expect(round.stored).toBe(1);

    // A data logger: issued a key, then it pushes a batch into that run.
    const issued = await expectOk('post', '/api/loggers', '/api/loggers', { engineId: engine.id, name: 'Contract logger' });
    const pushed = await expectOk(
      'post',
      '/api/logger/readings',
      '/api/logger/readings',
      { runId: run.id, readings: [{ clientId: randomUUID(), pointId: point.id, value: 21, takenAt: new Date().toISOString() }] },
      { 'x-logger-key': String(issued.key) },
    );
    expect(pushed.stored).toBe(1);

    // The calculators, each with the example values its description carries.
    const drawn = drawIndicatorCard({
      seed: 'contract',
      end: 'crank',
      admissionPressurePsia: 39,
      backPressurePsia: 3.3,
      cutOffFraction: 0.42,
      clearanceFraction: 0.06,
      springPsiPerIn: 20,
      lengthIn: 3.5,
    });
    for (const { method, path, op } of operationsOf(doc).filter((o) => o.path.startsWith('/api/calculations/'))) {
      const content = (op.requestBody as { content: Record<string, unknown> }).content;
      if (!('application/json' in content)) {
        // An upload (the card tracer): the drawn card's picture as the raw body, its scale in the query.
        await expectOk(method as 'post', path, `${path}?lengthIn=3.5&springPsiPerIn=20`, drawn.png, { 'content-type': 'image/png' });
        continue;
      }
      const ref = (op.requestBody as { content: Record<string, { schema: { $ref?: string } }> }).content['application/json'].schema.$ref;
      const schema = doc.components!.schemas![ref!.split('/').pop()!] as { properties: Record<string, { example?: unknown }> };
      const fromProperties = Object.fromEntries(Object.entries(schema.properties).map(([k, p]) => [k, p.example]));
      // A trace is hundreds of points: drawn here rather than written out in the description.
      const body = path.endsWith('/indicator-trace')
        ? { trace: drawn.trace, springPsiPerIn: 20, lengthIn: 3.5 }
        : (example(path) ?? fromProperties);
      await expectOk(method as 'post', path, path, body);
    }
    expect(problems).toEqual([]);
  });
});

export { check, call };
