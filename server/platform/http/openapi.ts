import { z } from 'zod';
import { errorBodySchema } from '../../../shared/contracts/common';

// The OpenAPI 3.1 document, generated from the same zod schemas the routes parse with,
// through zod 4's own z.toJSONSchema (see docs/decisions/003-openapi-from-zod.md).

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
  access: string;
};

/** `/api/stock/:id/image.png` -> `/api/stock/{id}/image.png` */
export function toOpenApiPath(path: string): string {
  return path.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '{$1}');
}

type Json = Record<string, unknown>;

function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): Json {
  const out = z.toJSONSchema(schema, { io, unrepresentable: 'any', target: 'draft-2020-12' }) as Json;
  delete out.$schema;
  return out;
}

function parameters(schema: z.ZodType, location: 'path' | 'query'): Json[] {
  const js = jsonSchema(schema, 'input');
  const props = (js.properties ?? {}) as Record<string, Json>;
  const required = new Set((js.required as string[] | undefined) ?? []);
  return Object.entries(props).map(([name, s]) => ({
    name,
    in: location,
    required: location === 'path' || required.has(name),
    schema: s,
  }));
}

export class OpenApiCollector {
  readonly routes: OpenApiRoute[] = [];

  add(route: OpenApiRoute) {
    this.routes.push(route);
  }

  document(version: string) {
    const paths: Record<string, Record<string, Json>> = {};
    const errorResponse = { description: 'Error', content: { 'application/json': { schema: jsonSchema(errorBodySchema, 'output') } } };
    for (const r of this.routes) {
      const status = String(r.status ?? 200);
      const success = r.response
        ? { description: 'OK', content: { 'application/json': { schema: jsonSchema(r.response, 'output') } } }
        : r.produces
          ? { description: 'OK', content: { [r.produces]: { schema: { type: 'string', format: 'binary' } } } }
          : { description: 'OK' };
      const op: Json = {
        summary: r.summary,
        description: `Access: ${r.access}`,
        tags: r.tags ?? [r.path.split('/')[2] ?? 'api'],
        parameters: [...(r.params ? parameters(r.params, 'path') : []), ...(r.query ? parameters(r.query, 'query') : [])],
        responses: { [status]: success, 400: errorResponse, 401: errorResponse, 403: errorResponse, 404: errorResponse },
      };
      if (r.body) {
        op.requestBody = {
          required: true,
          content: { [r.bodyType === 'multipart' ? 'multipart/form-data' : 'application/json']: { schema: jsonSchema(r.body, 'input') } },
        };
      }
      const p = toOpenApiPath(r.path);
      paths[p] = { ...paths[p], [r.method.toLowerCase()]: op };
    }
    return {
      openapi: '3.1.0',
      info: { title: 'Squarewright API', version, description: 'REST under /api, JSON, zod-validated both ways.' },
      servers: [{ url: '/' }],
      paths,
    };
  }
}
