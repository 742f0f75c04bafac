import { z } from 'zod';
import { trajectoryMetadataSchema } from '../../shared/trajectory.ts';
import type { AppContext } from '../context.ts';
import { badRequest } from '../errors.ts';
import {
  abandonUpload, completeUpload, deleteTrajectory, getTrajectory, getTrajectoryRow, listTrajectories, updateMetadata,
} from '../services/trajectories.ts';
import { extxyzCut, framesChunk } from '../services/trajectory-frames.ts';
import { idParams } from './params.ts';
import type { RouteDef } from './route-table.ts';
import { trajectoryUpload } from './upload-middleware.ts';

const rangeQuery = z.object({
  from: z.coerce.number().int().min(0).default(0),
  to: z.coerce.number().int().min(1).default(Number.MAX_SAFE_INTEGER),
  stride: z.coerce.number().int().min(1).max(1_000_000).default(1),
}).refine((r) => r.to > r.from, { message: 'to must be greater than from', path: ['to'] });

/** Multipart fields arrive as text: numbers are converted, blanks mean "not given". */
function metadataFromFields(body: Record<string, unknown>) {
  const fields: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(body ?? {})) {
    if (typeof value !== 'string' || value.trim() === '') continue;
    fields[key] = ['temperatureK', 'timeStep'].includes(key) ? Number(value) : value;
  }
  return trajectoryMetadataSchema.safeParse(fields);
}

export function trajectoryRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects/:id/trajectories', access: { kind: 'project', role: 'viewer', via: 'project' },
      handler: async (req, res) => {
        const { id } = idParams.parse(req.params);
        res.json(await listTrajectories(ctx, id));
      },
    },
    {
      method: 'post', path: '/projects/:id/trajectories', access: { kind: 'project', role: 'editor', via: 'project' },
      // Streams while multer reads the body; `before` runs after the access check, so nothing is stored for a caller without rights.
      before: [trajectoryUpload(ctx)],
      handler: async (req, res) => {
        const { id } = idParams.parse(req.params);
        const file = req.file;
        if (!file?.trajectoryId || !file.objectKey || file.sizeBytes === undefined || !file.sha256) {
          throw badRequest('No file received: send the trajectory as multipart/form-data in a field named "file".');
        }
        if (file.sizeBytes === 0) {
          await abandonUpload(ctx, file.trajectoryId, file.objectKey);
          throw badRequest(`The file "${file.originalname}" is empty: there is nothing to inspect.`);
        }
        const metadata = metadataFromFields(req.body as Record<string, unknown>);
        if (!metadata.success) {
          await abandonUpload(ctx, file.trajectoryId, file.objectKey);
          throw metadata.error;
        }
        const stored = { trajectoryId: file.trajectoryId, objectKey: file.objectKey, sizeBytes: file.sizeBytes, sha256: file.sha256 };
        try {
          res.status(201).json(await completeUpload(ctx, stored, metadata.data));
        } catch (err) {
          // Whatever failed after the bytes were stored, the upload is undone rather than left `uploading`.
          await abandonUpload(ctx, stored.trajectoryId, stored.objectKey).catch(() => {});
          throw err;
        }
      },
    },
    {
      method: 'get', path: '/trajectories/:id', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      handler: async (req, res) => {
        res.json(await getTrajectory(ctx, idParams.parse(req.params).id));
      },
    },
    {
      method: 'patch', path: '/trajectories/:id', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      handler: async (req, res) => {
        const { id } = idParams.parse(req.params);
        res.json(await updateMetadata(ctx, id, trajectoryMetadataSchema.parse(req.body)));
      },
    },
    {
      method: 'delete', path: '/trajectories/:id', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      handler: async (req, res) => {
        await deleteTrajectory(ctx, idParams.parse(req.params).id);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/trajectories/:id/frames', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      handler: async (req, res) => {
        const row = await getTrajectoryRow(ctx, idParams.parse(req.params).id);
        const body = await framesChunk(ctx, row, rangeQuery.parse(req.query));
        res.type('application/octet-stream').setHeader('Cache-Control', 'private, max-age=3600');
        res.send(body);
      },
    },
    {
      method: 'get', path: '/trajectories/:id/cut', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      handler: async (req, res) => {
        const row = await getTrajectoryRow(ctx, idParams.parse(req.params).id);
        const range = rangeQuery.parse(req.query);
        const chunks = extxyzCut(ctx, row, range);
        const first = await chunks.next();
        const base = row.name.replace(/\.(gz|zip)$/i, '').replace(/\.[^.]*$/, '') || 'trajectory';
        // The name as uploaded, in filename* (RFC 6266/8187), with an ASCII fallback for old clients.
        res.attachment(`${base}-frames-${range.from}.extxyz`);
        res.type('text/plain; charset=utf-8');
        if (!first.done) res.write(first.value);
        for await (const chunk of chunks) {
          if (!res.write(chunk)) await new Promise((resolve) => res.once('drain', resolve));
        }
        res.end();
      },
    },
  ];
}
