import { z } from 'zod';
import { APP_VERSION } from '../version.ts';
import { buildOpenApiDocument, type OpenApiDocument } from './openapi-document.ts';
import { download, type RouteDef } from './route-table.ts';

/** GET /api/openapi.json, built once from the finished table it belongs to. */
export function openApiRoutes(table: () => readonly RouteDef[]): RouteDef[] {
  let document: OpenApiDocument | undefined;
  return [{
    method: 'get', path: '/openapi.json', access: { kind: 'public' },
    summary: 'This API described as an OpenAPI 3.1 document, generated from the route table and its schemas.',
    response: download('application/json', 'An OpenAPI 3.1 document.', z.looseObject({ openapi: z.literal('3.1.0') })),
    handler: (_req, res) => {
      document ??= buildOpenApiDocument(table(), APP_VERSION);
      res.json(document);
    },
  }];
}
