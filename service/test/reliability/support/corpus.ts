/**
 * Generic bad-input cases for every write operation of the OpenAPI document (/api/docs-json): from each
 * request body schema a valid-looking body is built, then broken one way at a time — wrong types, missing
 * and unknown fields, NaN/Infinity, huge numbers and strings, injection strings where only an id, enum,
 * e-mail or date fits, malformed and oversized JSON, mislabelled uploads. Every case is bad by
 * construction, so every one must be refused with a 4xx and change nothing.
 */
import { randomUUID } from 'node:crypto';

export interface HttpCase {
  /** e.g. "POST /api/runs: title — wrong type (number)" */
  name: string;
  /** Router key of the operation, e.g. 'POST /api/runs/:id' (tells the test which credentials to use). */
  routeKey: string;
  method: string;
  path: string;
  contentType?: string;
  body?: string | Buffer;
  headers?: Record<string, string>;
}

interface Schema {
  $ref?: string;
  type?: string;
  enum?: unknown[];
  example?: unknown;
  properties?: Record<string, Schema>;
  required?: string[];
  items?: Schema;
  format?: string;
}
interface Operation {
  requestBody?: { content?: Record<string, { schema?: Schema }> };
}
export interface OpenApiDoc {
  paths: Record<string, Record<string, Operation>>;
  components?: { schemas?: Record<string, Schema> };
}

export const SQL_INJECTION = "1'; DROP TABLE readings; --";
export const SQL_TAUTOLOGY = "' OR '1'='1";
export const HTML_INJECTION = '<script>alert("x")</script>';
export const HTML_IMG = '<img src=x onerror=alert(1)>';
/** Larger than any text limit of the API (the largest is a few thousand characters), well under the 5 MB body limit. */
export const HUGE_TEXT = 'x'.repeat(300_000);
/** Above the 5 MB JSON body limit of app.factory.ts. */
export const OVERSIZED_JSON = () => JSON.stringify({ padding: 'y'.repeat(6 * 1024 * 1024) });

type Kind = 'uuid' | 'email' | 'date' | 'secret' | 'text';
function stringKind(name: string, s: Schema): Kind {
  if (s.format === 'uuid' || name === 'id' || /Id$/.test(name)) return 'uuid';
  if (s.format === 'email' || /email/i.test(name)) return 'email';
  if (s.format === 'date-time' || s.format === 'date' || /(At|Date|date|For|Until|Since|Due|On)$/.test(name)) return 'date';
  if (/password|pin$|token|signature|secret/i.test(name)) return 'secret';
  return 'text';
}

/** How many properties of each request body get a mutation (taken in turn across operations). */
export const PROPERTIES_PER_OPERATION = 4;

/** The first bytes of a PNG file (its signature and the start of an IHDR chunk): looks like an image to a sniffer. */
const PNG_BYTES = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]);

interface FormPart {
  name: string;
  filename?: string;
  type?: string;
  data: Buffer;
}
/** A multipart/form-data body built by hand (RFC 7578). */
function multipart(parts: FormPart[]): { body: Buffer; contentType: string } {
  const boundary = `----corpus${randomUUID().replace(/-/g, '')}`;
  const chunks: Buffer[] = [];
  for (const p of parts) {
    const disposition = `form-data; name="${p.name}"${p.filename ? `; filename="${p.filename}"` : ''}`;
    chunks.push(
      Buffer.from(`--${boundary}\r\nContent-Disposition: ${disposition}\r\n${p.type ? `Content-Type: ${p.type}\r\n` : ''}\r\n`),
      p.data,
      Buffer.from('\r\n'),
    );
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(chunks), contentType: `multipart/form-data; boundary=${boundary}` };
}

export function openApiToRouterPath(path: string): string {
  return path.replace(/\{([^}]+)\}/g, ':$1');
}

export function generateCases(doc: OpenApiDoc): HttpCase[] {
  const schemas = doc.components?.schemas ?? {};
  const resolve = (s: Schema | undefined): Schema => {
    let cur = s ?? {};
    for (let i = 0; cur.$ref && i < 10; i++) cur = schemas[cur.$ref.split('/').pop()!] ?? {};
    return cur;
  };

  /** A plausible value for a property (ids are fresh UUIDs, so the body refers to nothing that exists). */
  const sample = (name: string, s0: Schema, depth = 0): unknown => {
    const s = resolve(s0);
    if (s.enum?.length) return s.enum[0];
    switch (s.type) {
      case 'string': {
        if (typeof s.example === 'string') return s.example;
        const k = stringKind(name, s);
        return k === 'uuid'
          ? randomUUID()
          : k === 'email'
            ? 'someone@e2e.crankjournal.test'
            : k === 'date'
              ? new Date().toISOString()
              : k === 'secret'
                ? 'not-the-password-123'
                : 'Bad input corpus';
      }
      case 'number':
      case 'integer':
        return typeof s.example === 'number' ? s.example : 1;
      case 'boolean':
        return true;
      case 'array': {
        const item = resolve(s.items);
        if (depth > 2) return [];
        if (item.type === 'object' || item.properties) return [sample(name, item, depth + 1)];
        if (item.type === 'string') return [sample(name.replace(/s$/, ''), item, depth + 1)];
        return [];
      }
      default:
        if (s.properties) {
          const out: Record<string, unknown> = {};
          for (const [k, v] of Object.entries(s.properties)) {
            const r = resolve(v);
            if (!s.required?.includes(k) && r.type === 'object' && !r.properties) continue;
            const val = sample(k, v, depth + 1);
            if (val !== undefined) out[k] = val;
          }
          return out;
        }
        return undefined;
    }
  };

  const out: HttpCase[] = [];
  // Each operation gets the body-level cases and, per property, its "missing" case and ONE of the mutations
  // that fit its type, taken in turn (so the corpus stays a few hundred cases while every kind is used).
  let turn = 0;
  const pick = <T>(list: T[]): T => list[turn++ % list.length];
  let opIndex = 0;
  for (const [apiPath, ops] of Object.entries(doc.paths)) {
    for (const [m, op] of Object.entries(ops)) {
      const method = m.toUpperCase();
      if (!['POST', 'PUT', 'PATCH', 'DELETE'].includes(method)) continue;
      opIndex++;
      const routePath = openApiToRouterPath(apiPath);
      const routeKey = `${method} ${routePath}`;
      const params = [...apiPath.matchAll(/\{([^}]+)\}/g)].map((x) => x[1]);
      const at = (value?: (p: string) => string) =>
        apiPath.replace(/\{([^}]+)\}/g, (_x, p: string) => encodeURIComponent(value ? value(p) : randomUUID()));
      const add = (what: string, c: Omit<HttpCase, 'name' | 'routeKey' | 'method' | 'path'> & { path?: string }) =>
        out.push({ ...c, name: `${routeKey}: ${what}`, routeKey, method, path: c.path ?? at() });
      const json = (what: string, body: unknown, path?: string) =>
        add(what, { contentType: 'application/json', body: JSON.stringify(body), path });
      const raw = (what: string, text: string, contentType = 'application/json', path?: string) =>
        add(what, { contentType, body: text, path });

      const content = op.requestBody?.content ?? {};
      const jsonSchema = content['application/json']?.schema;
      const body = jsonSchema ? resolve(jsonSchema) : null;
      const base = body ? ((sample('body', body) as Record<string, unknown>) ?? {}) : {};

      // Path parameters that carry injection text instead of an id or a key.
      for (const p of params) {
        const [label, text] = pick([
          ['SQL injection', SQL_TAUTOLOGY],
          ['HTML injection', HTML_IMG],
          ['SQL injection', SQL_INJECTION],
        ]);
        const path = at((q) => (q === p ? text : randomUUID()));
        if (jsonSchema) json(`path ${p} — ${label}`, base, path);
        else add(`path ${p} — ${label}`, { path });
      }
      if (!body && !Object.keys(content).length && params.length) add('unknown ids', {});

      if (body) {
        const props = body.properties ?? {};
        const required = body.required ?? [];
        json('unknown field', { ...base, zzUnknownField: 'surprise' });
        const [what, text, type] = pick([
          ['a list instead of an object', JSON.stringify([base]), 'application/json'],
          ['malformed JSON', '{"unterminated": ', 'application/json'],
          ['JSON null', 'null', 'application/json'],
          ['a bare string', '"just text"', 'application/json'],
          ['unknown field __proto__', JSON.stringify(base).replace(/^\{/, '{"__proto__":{"role":"administrator"},'), 'application/json'],
          ['JSON sent as text/plain', JSON.stringify({ ...base, zzUnknownField: 1 }), 'text/plain'],
          ...(required.length ? [['empty object', '{}', 'application/json']] : []),
        ]);
        raw(what, text, type);
        if (opIndex <= 2) add('oversized JSON body (6 MB)', { contentType: 'application/json', body: OVERSIZED_JSON() });

        // At most PROPERTIES_PER_OPERATION properties of each body, a different slice each operation.
        const entries = Object.entries(props);
        const from = entries.length ? opIndex % entries.length : 0;
        const chosen = [...entries.slice(from), ...entries.slice(0, from)].slice(0, PROPERTIES_PER_OPERATION);
        for (const [name, ps0] of chosen) {
          const ps = resolve(ps0);
          const withValue = (v: unknown) => ({ ...base, [name]: v });
          const isRequired = required.includes(name);
          const type = ps.enum ? 'enum' : (ps.type ?? (ps.properties ? 'object' : 'unknown'));
          const choices: [string, () => void][] = [];
          const v = (what: string, value: unknown) => choices.push([what, () => json(`${name} — ${what}`, withValue(value))]);
          const literal = (what: string, lit: string) =>
            choices.push([what, () => raw(`${name} — ${what}`, JSON.stringify(withValue(0)).replace(`"${name}":0`, `"${name}":${lit}`))]);
          if (isRequired) {
            const { [name]: _dropped, ...rest } = base;
            choices.push(['missing', () => json(`${name} — missing`, rest)]);
            v('null', null);
          }
          switch (type) {
            case 'enum':
              v('not one of the allowed values (SQL)', SQL_TAUTOLOGY);
              v('not one of the allowed values (HTML)', HTML_INJECTION);
              v('wrong type (number)', 7);
              break;
            case 'string': {
              v('wrong type (number)', 12345);
              v('wrong type (object)', { text: 'x' });
              v('huge string (300k characters)', HUGE_TEXT);
              const k = stringKind(name, ps);
              if (k === 'uuid') {
                v('SQL injection instead of an id', SQL_INJECTION);
                v('HTML injection instead of an id', HTML_IMG);
              } else if (k === 'email') {
                v('HTML injection instead of an e-mail address', `${HTML_IMG}@example`);
              } else if (k === 'date') {
                v('not a date', 'yesterday');
                v('a date far away (year 99999)', '99999-01-01T00:00:00Z');
              }
              break;
            }
            case 'number':
            case 'integer':
              v('wrong type (numeric string)', '12');
              v('"NaN"', 'NaN');
              v('"Infinity"', 'Infinity');
              literal('1e400 (Infinity once parsed)', '1e400');
              literal('-1e400 (-Infinity once parsed)', '-1e400');
              v('huge number 1e300', 1e300);
              break;
            case 'boolean':
              v('wrong type (string)', 'yes');
              break;
            case 'array': {
              v('wrong type (string instead of a list)', 'not a list');
              const item = resolve(ps.items);
              if (item.type === 'object' || item.properties) {
                const good = sample(name, item) as Record<string, unknown>;
                v('a list of strings instead of objects', ['x']);
                v('an item with an unknown field', [{ ...good, zzUnknownField: true }]);
              } else if (item.type === 'string') {
                v('an item that is a number', [42]);
                if (stringKind(name.replace(/s$/, ''), item) === 'uuid') v('an item that is SQL injection', [SQL_INJECTION]);
              }
              break;
            }
            default:
              v('wrong type (number)', 99);
          }
          pick(choices)[1]();
        }
      }

      // Forms with a file (multer's FileInterceptor): declared by @ApiConsumes('multipart/form-data').
      const formSchema = content['multipart/form-data']?.schema;
      if (formSchema) {
        const fs = resolve(formSchema);
        const fileField = Object.entries(fs.properties ?? {}).find(([, v]) => resolve(v).format === 'binary')?.[0] ?? 'file';
        const form = (what: string, parts: FormPart[]) => {
          const { body: b, contentType } = multipart(parts);
          add(what, { contentType, body: b });
        };
        form('form — a text file labelled image/png', [
          { name: fileField, filename: 'photo.png', type: 'image/png', data: Buffer.from('not a picture, only text pretending\n') },
        ]);
        form('form — a script labelled application/pdf', [
          { name: fileField, filename: 'report.pdf', type: 'application/pdf', data: Buffer.from(`${HTML_INJECTION}\n`) },
        ]);
        form('form — no file', [{ name: 'caption', data: Buffer.from('a caption and no file') }]);
        form('form — an unknown field', [
          { name: fileField, filename: 'photo.png', type: 'image/png', data: PNG_BYTES },
          { name: 'zzUnknownField', data: Buffer.from('surprise') },
        ]);
        form('form — oversized file (11 MB, over UPLOAD_MAX_BYTES)', [
          { name: fileField, filename: 'big.png', type: 'image/png', data: Buffer.concat([PNG_BYTES, Buffer.alloc(11 * 1024 * 1024, 1)]) },
        ]);
        add('form — JSON instead of a form', { contentType: 'application/json', body: JSON.stringify({ caption: 'no file' }) });
      }

      // Raw uploads (CSV, images): declared by @ApiConsumes.
      const uploadTypes = Object.keys(content).filter((c) => c !== 'application/json' && c !== 'multipart/form-data');
      if (uploadTypes.some((c) => c.startsWith('image/'))) {
        add('upload — text mislabelled as image/png', {
          contentType: 'image/png',
          body: Buffer.from('this is not a picture, only text pretending\n'),
        });
        add('upload — a script labelled image/jpeg', { contentType: 'image/jpeg', body: Buffer.from(`${HTML_INJECTION}\n`) });
        add('upload — empty body', { contentType: 'image/png', body: Buffer.alloc(0) });
        add('upload — JSON instead of a file', {
          contentType: 'application/json',
          body: JSON.stringify({ image: 'data:image/png;base64,AAAA' }),
        });
        add('upload — oversized (11 MB, over UPLOAD_MAX_BYTES)', {
          contentType: 'image/png',
          body: Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(11 * 1024 * 1024, 1)]),
        });
      }
      if (uploadTypes.some((c) => c.includes('csv'))) {
        add('upload — CSV with formula cells', {
          contentType: 'text/csv',
          body: "taken_at,point,value\n2026-06-14T10:00:00Z,=cmd|' /C calc'!A0,=1+2\n",
        });
        add('upload — CSV with broken quoting', {
          contentType: 'text/csv',
          body: 'taken_at,point,value\n"2026-06-14T10:00:00Z,"THR,"12\n',
        });
        add('upload — CSV mislabelled as image/png', { contentType: 'image/png', body: 'taken_at,point,value\n' });
        add('upload — empty CSV', { contentType: 'text/csv', body: '' });
      }
    }
  }
  return out;
}
