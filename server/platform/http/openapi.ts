import { z } from 'zod';
import * as authContracts from '../../../shared/contracts/auth';
import * as commonContracts from '../../../shared/contracts/common';
import * as editionsContracts from '../../../shared/contracts/editions';
import * as foundryContracts from '../../../shared/contracts/foundry';
import * as integrationsContracts from '../../../shared/contracts/integrations';
import * as jobsContracts from '../../../shared/contracts/jobs';
import * as ledgerContracts from '../../../shared/contracts/ledger';
import * as payoutsContracts from '../../../shared/contracts/payouts';
import * as preflightContracts from '../../../shared/contracts/preflight';
import * as pressContracts from '../../../shared/contracts/press';
import * as publicationsContracts from '../../../shared/contracts/publications';
import * as puzzlesContracts from '../../../shared/contracts/puzzles';
import * as readerContracts from '../../../shared/contracts/reader';
import * as stockContracts from '../../../shared/contracts/stock';
import * as submissionsContracts from '../../../shared/contracts/submissions';
import * as templatesContracts from '../../../shared/contracts/templates';
import * as tilingsContracts from '../../../shared/contracts/tilings';
import * as usersContracts from '../../../shared/contracts/users';
import { routeExamples } from './openapi-examples';

// The OpenAPI 3.1 document, generated from the same zod schemas the routes parse with,
// through zod 4's own z.toJSONSchema (decisions 003 and 080).
//
// Every schema a route uses ends up in components/schemas under a name, and the routes refer
// to it with $ref: the exported contract schemas by their export name (`editionSchema` ->
// `Edition`), a route's own body or answer by its operation (`CreateEditionBody`). Recursive
// schemas (the rich text) are therefore references between components, never to the
// document's root. A schema whose request form (zod's input: defaults optional, coercions
// open) differs from its answer form gets a second component `<Name>Input`.

/** Every contract module: a new file in shared/contracts/ gets a line here (tests/server/platform/openapi-document.test.ts checks). */
export const contractModules: Record<string, Record<string, unknown>> = {
  auth: authContracts,
  common: commonContracts,
  editions: editionsContracts,
  foundry: foundryContracts,
  integrations: integrationsContracts,
  jobs: jobsContracts,
  ledger: ledgerContracts,
  payouts: payoutsContracts,
  preflight: preflightContracts,
  press: pressContracts,
  publications: publicationsContracts,
  puzzles: puzzlesContracts,
  reader: readerContracts,
  stock: stockContracts,
  submissions: submissionsContracts,
  templates: templatesContracts,
  tilings: tilingsContracts,
  users: usersContracts,
};

export type OpenApiExamples = {
  /** an example request body (JSON routes) */
  request?: unknown;
  /** an example of the success answer */
  response?: unknown;
};

export type OpenApiRoute = {
  method: string;
  path: string;
  summary: string;
  tags?: string[];
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  bodyType?: 'json' | 'multipart';
  response?: z.ZodType;
  status?: number;
  produces?: string;
  /** 'public', 'signed-in' or the roles (from the permission table), or a free text for routes served elsewhere */
  access: string | readonly string[];
  /** the API-key scope that may call this route (none: sessions only) */
  scope?: string;
  examples?: OpenApiExamples;
  /** answers 304 to If-None-Match (documents the ETag header) */
  etag?: boolean;
};

/** `/api/stock/:id/image.png` -> `/api/stock/{id}/image.png` */
export function toOpenApiPath(path: string): string {
  return path.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '{$1}');
}

type Json = Record<string, unknown>;
/** A JSON object of JSON objects (a map of schemas), read back after a text rewrite of our own document. */
const schemaMapSchema = z.record(z.string(), z.record(z.string(), z.unknown()));

const pascal = (words: string[]) => words.map((w) => w.charAt(0).toUpperCase() + w.slice(1)).join('');

/** `GET /api/stock/:id/image.png` -> `getStockByIdImagePng` */
export function operationIdOf(method: string, path: string): string {
  const words = path
    .replace(/^\/api\//, '')
    .split('/')
    .flatMap((seg) => (seg.startsWith(':') ? ['by', seg.slice(1)] : seg.split(/[^A-Za-z0-9]+/)))
    .filter((w) => w.length > 0);
  return method.toLowerCase() + pascal(words);
}

/** Component names for the exported contract schemas: `editionSchema` -> `Edition`. */
function contractNames(): Map<z.ZodType, string> {
  const names = new Map<z.ZodType, string>();
  const taken = new Map<string, string>();
  for (const [module, exports] of Object.entries(contractModules)) {
    for (const [exportName, value] of Object.entries(exports)) {
      if (!(value instanceof z.ZodType) || names.has(value)) continue;
      let name = pascal([exportName.replace(/Schema$/, '')]);
      if (taken.has(name)) name = pascal([module, name]);
      taken.set(name, module);
      names.set(value, name);
    }
  }
  return names;
}

const refPrefix = '#/components/schemas/';
const inputMark = '__input';

function walk(node: unknown, visit: (obj: Json) => void) {
  if (Array.isArray(node)) for (const n of node) walk(n, visit);
  else if (node && typeof node === 'object') {
    visit(node as Json);
    for (const v of Object.values(node)) walk(v, visit);
  }
}

/** Convert every registered schema in one mode; references between them point at components. */
function convert(registry: z.core.$ZodRegistry<{ id: string }>, io: 'input' | 'output'): Record<string, Json> {
  const mark = io === 'input' ? inputMark : '';
  const { schemas } = z.toJSONSchema(registry, {
    io,
    target: 'draft-2020-12',
    unrepresentable: 'any',
    cycles: 'ref',
    reused: 'inline',
    uri: (id) => `${refPrefix}${id}${mark}`,
  }) as { schemas: Record<string, Json> };
  // a cycle through an unnamed schema lands in __shared; give those names of their own
  const shared = (schemas.__shared?.$defs ?? {}) as Record<string, Json>;
  delete schemas.__shared;
  for (const [id, def] of Object.entries(shared)) schemas[`Shared${id.replace(/\W/g, '')}`] = def;
  const text = JSON.stringify(schemas).replace(
    new RegExp(`${refPrefix.replace(/[/#]/g, '\\$&')}__shared${mark}#/\\$defs/(\\w+)`, 'g'),
    (_m, id: string) => `${refPrefix}Shared${id.replace(/\W/g, '')}${mark}`,
  );
  const out: Record<string, Json> = schemaMapSchema.parse(JSON.parse(text));
  for (const s of Object.values(out)) {
    delete s.$schema;
    delete s.$id;
  }
  return out;
}

/**
 * Merge the answer and request forms: a component whose request form equals its answer form
 * (after its references are merged the same way) is written once; the others get `<Name>Input`.
 */
function mergeForms(output: Record<string, Json>, input: Record<string, Json>) {
  const refsOf = (s: Json) => {
    const refs = new Set<string>();
    walk(s, (o) => {
      if (typeof o.$ref === 'string' && o.$ref.startsWith(refPrefix)) refs.add(o.$ref.slice(refPrefix.length).replace(inputMark, ''));
    });
    return refs;
  };
  const strip = (s: Json) => JSON.stringify(s).replaceAll(inputMark, '');
  const differs = new Set(Object.keys(input).filter((id) => !output[id] || strip(input[id]!) !== JSON.stringify(output[id])));
  for (let grew = true; grew; ) {
    grew = false;
    for (const id of Object.keys(input)) {
      if (differs.has(id)) continue;
      if ([...refsOf(input[id]!)].some((r) => differs.has(r))) {
        differs.add(id);
        grew = true;
      }
    }
  }
  // `<Name>Input`, unless a contract already has that name (publicationInputSchema beside publicationSchema)
  const inputNames = new Map<string, string>();
  for (const id of differs) {
    let name = `${id}Input`;
    while (output[name] || input[name]) name = `${name}Form`;
    inputNames.set(id, name);
  }
  const rename = (s: Json) =>
    JSON.parse(
      JSON.stringify(s).replace(new RegExp(`"${refPrefix.replace(/[/#]/g, '\\$&')}(\\w+?)${inputMark}"`, 'g'), (_m, id: string) =>
        inputNames.has(id) ? `"${refPrefix}${inputNames.get(id)}"` : `"${refPrefix}${id}"`,
      ),
    ) as Json;
  const components: Record<string, Json> = {};
  for (const [id, s] of Object.entries(output)) components[id] = s;
  for (const id of differs) components[inputNames.get(id)!] = rename(input[id]!);
  return { components, inputVariants: new Set(inputNames.values()), inputName: (id: string) => inputNames.get(id) ?? id };
}

/**
 * An example value made from a JSON schema (the first enum value, the smallest number allowed,
 * one item per list, a fixed date...). The document shows it only when the route's own zod
 * schema accepts it (see `document`), so an example is never one the API would refuse.
 */
const sampleStrings = [
  'GBP',
  'GB',
  '2026-12-05',
  '2026-12',
  '09:00',
  'Europe/London',
  'https://www.example.com',
  '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)',
  'b94d27b9934d3e08a52e52d7da7dabfac484efe37a5380ee9088f7ace2efcde9',
];
const stringHints: Record<string, string> = {
  currency: 'GBP',
  country: 'GB',
  date: '2026-12-05',
  editionDate: '2026-12-05',
  month: '2026-12',
  timeZone: 'Europe/London',
  releaseTime: '09:00',
  code: '9 33 32 (18,15)(7,8)(14,4)(10,1)(9)',
};

export function exampleOf(schema: unknown, components: Record<string, Json>, depth = 0, mode: 'request' | 'response' = 'response', name = ''): unknown {
  if (!schema || typeof schema !== 'object' || depth > 40) return null;
  const s = schema as Json;
  const next = (x: unknown, n = name) => exampleOf(x, components, depth + 1, mode, n);
  if (typeof s.$ref === 'string') return next(components[s.$ref.slice(refPrefix.length)]);
  if (Array.isArray(s.examples) && s.examples.length > 0) return s.examples[0];
  if ('const' in s) return s.const;
  if (Array.isArray(s.enum)) return s.enum[0];
  for (const k of ['anyOf', 'oneOf'] as const) {
    const options = s[k];
    if (Array.isArray(options)) {
      const pick = options.find((o) => !(o && typeof o === 'object' && (o as Json).type === 'null')) ?? options[0];
      return next(pick);
    }
  }
  if (Array.isArray(s.allOf)) return Object.assign({}, ...s.allOf.map((o) => next(o) as object));
  const type = Array.isArray(s.type) ? (s.type as string[]).find((x) => x !== 'null') : s.type;
  switch (type) {
    case 'object': {
      // a request names what it must; an answer shows every field
      const props = (s.properties ?? {}) as Record<string, unknown>;
      const required = new Set(Array.isArray(s.required) ? (s.required as string[]) : []);
      const out: Json = {};
      for (const [k, v] of Object.entries(props)) if (mode === 'response' || required.has(k)) out[k] = next(v, k);
      // a change request with every field optional: name the first one
      const first = Object.entries(props)[0];
      if (Object.keys(out).length === 0 && first) out[first[0]] = next(first[1], first[0]);
      return out;
    }
    case 'array': {
      if (Array.isArray(s.prefixItems)) return s.prefixItems.map((x) => next(x));
      const n = Math.max(1, Number(s.minItems ?? 1));
      // deep lists (the rich text's own nodes) stay empty when they may
      return depth > 16 && !s.minItems ? [] : Array.from({ length: n }, () => next(s.items));
    }
    case 'integer':
    case 'number': {
      const min = typeof s.minimum === 'number' ? s.minimum : typeof s.exclusiveMinimum === 'number' ? s.exclusiveMinimum + 1 : 1;
      const max = typeof s.maximum === 'number' ? s.maximum : typeof s.exclusiveMaximum === 'number' ? s.exclusiveMaximum - 1 : Number.MAX_SAFE_INTEGER;
      return Math.min(Math.max(min, 1), max);
    }
    case 'boolean':
      return true;
    case 'null':
      return null;
    case 'string': {
      const formats: Record<string, string> = {
        'date-time': '2026-12-04T09:00:00.000Z',
        date: '2026-12-05',
        email: 'editor@demo.squarewright.test',
        uri: 'https://desk.example.org/hooks/squarewright',
        url: 'https://desk.example.org/hooks/squarewright',
        uuid: '6f1c2a4e-0d7b-4c39-9a51-2f7d3c1b8e90',
      };
      if (typeof s.format === 'string' && formats[s.format]) return formats[s.format];
      if (typeof s.pattern === 'string') {
        const re = new RegExp(s.pattern as string, 'u');
        const fit = [stringHints[name], ...sampleStrings].find((x) => x !== undefined && re.test(x));
        if (fit) return fit;
      }
      if (stringHints[name]) return stringHints[name];
      const min = Number(s.minLength ?? 0);
      const text = 'text';
      return min > text.length ? 'x'.repeat(min) : text;
    }
    default:
      return null;
  }
}

const errorStatuses = {
  400: ['BadRequest', 'The request does not read: a parameter, the query or the body fails its schema', 'bad_request', 'Invalid request', [{ path: 'body.name', message: 'Too small: expected string to have >=1 characters' }]],
  401: ['Unauthorized', 'No session, or an API key that is unknown, expired or revoked', 'unauthorized', 'Sign in first.', undefined],
  403: ['Forbidden', "The user's role (or the API key's scopes) may not call this route", 'forbidden', 'The printer role may not call GET /api/stock.', undefined],
  404: ['NotFound', 'No such thing (or not visible to this user)', 'not_found', 'No edition 42.', undefined],
  409: ['Conflict', 'The thing is not in a state that allows this (or was changed meanwhile)', 'conflict', 'The edition is published; it cannot be changed.', undefined],
  413: ['PayloadTooLarge', 'The body or the uploaded file is too large', 'payload_too_large', 'The request body is larger than 1 MB.', undefined],
  422: ['Unprocessable', 'The request reads but its content is wrong; details say where', 'unprocessable', 'The tiling does not verify.', [{ path: 'body.code', message: 'Square 3 overlaps square 5.' }]],
  429: ['TooManyRequests', 'Too many requests (per API key, or sign-in attempts per address); see Retry-After', 'rate_limited', 'Too many requests for this API key; try again in 30 s.', undefined],
} as const;

function errorResponses(): Record<string, Json> {
  const out: Record<string, Json> = {};
  for (const [, [name, description, code, message, details]] of Object.entries(errorStatuses)) {
    out[name] = {
      description,
      ...(name === 'TooManyRequests' ? { headers: { 'Retry-After': { description: 'seconds to wait', schema: { type: 'integer' } } } } : {}),
      content: {
        'application/json': {
          schema: { $ref: `${refPrefix}Error` },
          example: { error: { code, message, ...(details ? { details } : {}) } },
        },
      },
    };
  }
  return out;
}

/** The form of an upload route without a body schema: one file in the field "file" (the convention of every upload route). */
const uploadFormSchema = {
  type: 'object',
  properties: { file: { type: 'string', contentMediaType: 'application/octet-stream', description: 'the file, sent as a multipart part named "file"' } },
  required: ['file'],
};

function errorsFor(r: OpenApiRoute): number[] {
  const codes: number[] = [];
  const write = r.method !== 'GET';
  const hasBody = r.body !== undefined || r.bodyType === 'multipart';
  if (r.params || r.query || hasBody || r.access === 'public (better-auth)') codes.push(400);
  if (r.access !== 'public' && r.access !== 'public (better-auth)') codes.push(401, 403);
  if (r.params) codes.push(404);
  if (write) codes.push(409);
  if (hasBody) codes.push(413);
  if (write) codes.push(422);
  codes.push(429);
  return codes;
}

function accessText(access: OpenApiRoute['access']): string {
  if (typeof access !== 'string') return `roles: ${access.join(', ')}${access.includes('editor') && !access.includes('admin') ? ' (and admin)' : ''}`;
  if (access === 'public') return 'public (no sign-in)';
  if (access === 'signed-in') return 'any signed-in user';
  return access;
}

export class OpenApiCollector {
  readonly routes: OpenApiRoute[] = [];

  private built: { version: string; doc: ReturnType<OpenApiCollector['build']> } | undefined;

  add(route: OpenApiRoute) {
    this.routes.push(route);
    this.built = undefined;
  }

  /** The document (built once; the routes do not change after start-up). */
  document(version: string) {
    if (this.built?.version !== version) this.built = { version, doc: this.build(version) };
    return this.built.doc;
  }

  private build(version: string) {
    const names = contractNames();
    const registry = z.registry<{ id: string }>();
    const used = new Set<string>();
    const idOf = (schema: z.ZodType, fallback: string): string => {
      const existing = registry.get(schema)?.id;
      if (existing) return existing;
      let id = names.get(schema) ?? fallback;
      while (used.has(id)) id = `${id}_`;
      used.add(id);
      registry.add(schema, { id });
      return id;
    };
    // register every contract schema first, so nested ones keep their names
    for (const [schema, name] of names) {
      used.add(name);
      registry.add(schema, { id: name });
    }
    idOf(commonContracts.errorBodySchema, 'Error');

    const plan = this.routes.map((r) => {
      const op = pascal([operationIdOf(r.method, r.path)]);
      return {
        r,
        operationId: operationIdOf(r.method, r.path),
        body: r.body && r.bodyType !== 'multipart' ? idOf(r.body, `${op}Body`) : undefined,
        response: r.response ? idOf(r.response, `${op}Response`) : undefined,
      };
    });

    const output = convert(registry, 'output');
    const input = convert(registry, 'input');
    const { components, inputVariants, inputName } = mergeForms(output, input);
    // the error body names the codes it may carry
    components.Error = z.toJSONSchema(
      z.object({ error: z.object({ code: commonContracts.errorCodeSchema, message: z.string(), details: z.unknown().optional() }) }).meta({
        description: 'Every error answer: what went wrong (code), in words (message), and where (details, e.g. [{ path: "body.email", message }])',
      }),
      { target: 'draft-2020-12' },
    ) as Json;
    delete components.Error.$schema;

    const inline = (schema: z.ZodType): Json => {
      const js = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any', target: 'draft-2020-12', metadata: z.registry() }) as Json;
      delete js.$schema;
      return js;
    };
    const parameters = (schema: z.ZodType, location: 'path' | 'query'): Json[] => {
      const js = inline(schema);
      const props = (js.properties ?? {}) as Record<string, Json>;
      const required = new Set((js.required as string[] | undefined) ?? []);
      return Object.entries(props).map(([name, s]) => ({
        name,
        in: location,
        required: location === 'path' || required.has(name),
        ...(typeof s.description === 'string' ? { description: s.description } : {}),
        schema: s,
      }));
    };

    /** the route's own example, else one made from its schema if the route's zod schema accepts it */
    const exampleFor = (given: unknown, schema: z.ZodType | undefined, componentId: string | undefined, mode: 'request' | 'response'): { example?: unknown } => {
      if (!schema || !componentId) return given === undefined ? {} : { example: given };
      if (given !== undefined) return schema.safeParse(given).success ? { example: given } : {};
      const made = exampleOf({ $ref: `${refPrefix}${componentId}` }, components, 0, mode);
      return schema.safeParse(made).success ? { example: made } : {};
    };
    const paths: Record<string, Record<string, Json>> = {};
    for (const { r, operationId, body, response } of plan) {
      const given = { ...routeExamples[`${r.method} ${r.path}`], ...r.examples };
      const status = String(r.status ?? 200);
      const headers = r.etag ? { ETag: { description: 'version of this answer; send it back in If-None-Match', schema: { type: 'string' } } } : undefined;
      const success: Json = response
        ? {
            description: 'OK',
            ...(headers ? { headers } : {}),
            content: { 'application/json': { schema: { $ref: `${refPrefix}${response}` }, ...exampleFor(given.response, r.response, response, 'response') } },
          }
        : r.produces
          ? { description: 'OK', content: { [r.produces]: { schema: { type: 'string', contentMediaType: r.produces } } } }
          : { description: status === '204' ? 'Done (no content)' : 'OK' };
      const responses: Json = { [status]: success };
      if (r.etag) responses['304'] = { description: 'Not modified: the If-None-Match ETag is still current' };
      for (const code of errorsFor(r)) responses[String(code)] = { $ref: `#/components/responses/${errorStatuses[code as keyof typeof errorStatuses][0]}` };
      const isPublic = r.access === 'public' || r.access === 'public (better-auth)';
      const op: Json = {
        operationId,
        summary: r.summary,
        description: `Access: ${accessText(r.access)}.${r.scope ? ` API key scope: \`${r.scope}\`.` : isPublic ? '' : ' Not open to API keys.'}`,
        tags: r.tags ?? [r.path.split('/')[2] ?? 'api'],
        security: isPublic ? [] : [{ session: [] }, ...(r.scope ? [{ apiKey: [r.scope] }] : [])],
        parameters: [...(r.params ? parameters(r.params, 'path') : []), ...(r.query ? parameters(r.query, 'query') : [])],
        responses,
      };
      if (r.etag) (op.parameters as Json[]).push({ name: 'If-None-Match', in: 'header', required: false, description: 'the ETag of an answer you hold', schema: { type: 'string' } });
      if (r.body) {
        const content: Json =
          r.bodyType === 'multipart'
            ? { 'multipart/form-data': { schema: inline(r.body) } }
            : { 'application/json': { schema: { $ref: `${refPrefix}${inputName(body!)}` }, ...exampleFor(given.request, r.body, inputName(body!), 'request') } };
        op.requestBody = { required: true, content };
      } else if (r.bodyType === 'multipart') {
        // upload routes read their file with multer (upload.single('file')), not through a zod body
        op.requestBody = { required: true, content: { 'multipart/form-data': { schema: uploadFormSchema } } };
      }
      const p = toOpenApiPath(r.path);
      paths[p] = { ...paths[p], [r.method.toLowerCase()]: op };
    }

    // keep the components the paths reach
    const reached = new Set<string>();
    const queue: unknown[] = [paths, components.Error];
    reached.add('Error');
    while (queue.length > 0) {
      walk(queue.pop(), (o) => {
        if (typeof o.$ref !== 'string' || !o.$ref.startsWith(refPrefix)) return;
        const id = o.$ref.slice(refPrefix.length);
        if (reached.has(id)) return;
        reached.add(id);
        queue.push(components[id]);
      });
    }
    // a request form whose answer form no route uses keeps the plain name
    const renamed = new Map<string, string>();
    for (const id of reached) {
      const base = id.slice(0, -'Input'.length);
      if (inputVariants.has(id) && !reached.has(base)) renamed.set(id, base);
    }
    const renameRefs = (value: Json): Json =>
      renamed.size === 0
        ? value
        : z.record(z.string(), z.unknown()).parse(JSON.parse(JSON.stringify(value).replace(/"#\/components\/schemas\/(\w+)"/g, (m, id: string) => (renamed.has(id) ? `"${refPrefix}${renamed.get(id)}"` : m))));
    const schemas: Record<string, Json> = {};
    for (const id of [...reached].sort()) {
      if (!components[id]) throw new Error(`OpenAPI: $ref to a missing component ${id}`);
      schemas[renamed.get(id) ?? id] = renameRefs(components[id]);
    }
    const finalPaths = renameRefs(paths);

    return {
      openapi: '3.1.0',
      info: {
        title: 'Squarewright API',
        version,
        description:
          'REST under /api, JSON, checked both ways against zod schemas. Sign in through /api/auth (a session cookie), or send an API key as `Authorization: Bearer <key>` (keys are made on the API keys page; each carries scopes). Errors always answer `{ "error": { "code", "message", "details" } }`.',
      },
      servers: [{ url: '/' }],
      tags: [...new Set(this.routes.flatMap((r) => r.tags ?? [r.path.split('/')[2] ?? 'api']))].sort().map((name) => ({ name })),
      paths: finalPaths,
      components: {
        schemas,
        responses: errorResponses(),
        securitySchemes: {
          session: { type: 'apiKey', in: 'cookie', name: 'better-auth.session_token', description: 'the session cookie set by POST /api/auth/sign-in/email' },
          apiKey: { type: 'http', scheme: 'bearer', description: 'an API key (`sqw_...`) with the scopes the route names' },
        },
      },
    };
  }
}
