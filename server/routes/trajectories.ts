import { z } from 'zod';
import { bulkMetadataBody, frameRangeQuery, trajectoryMetadataSchema, trajectorySchema } from '../../shared/trajectory.ts';
import { uploadPolicySchema, type UploadPolicy } from '../../shared/upload-policy.ts';
import { authorizedProject, authorizedTrajectory } from '../auth/authorize.ts';
import { apiRateLimits } from '../auth/rate-limits.ts';
import type { AppContext } from '../context.ts';
import { badRequest } from '../errors.ts';
import {
  abandonUpload, completeUpload, deleteTrajectory, getTrajectory, listTrajectories, updateMetadata, updateMetadataOfMany,
} from '../services/trajectories.ts';
import { cutFileName, extxyzCut, framesAnswer } from '../services/trajectory-frames.ts';
import { body, idField, params, query } from './request-parts.ts';
import { download, noContent, wrapped, type RouteDef } from './route-table.ts';
import { trajectoryUpload } from './upload-middleware.ts';

/** Multipart fields arrive as text: numbers are converted, blanks mean "not given". */
function metadataFromFields(fields: Record<string, unknown>) {
  const parsed: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(fields ?? {})) {
    if (typeof value !== 'string' || value.trim() === '') continue;
    parsed[key] = ['temperatureK', 'timeStep', 'constraints'].includes(key) ? Number(value) : key === 'speciesElements' ? jsonOrText(value) : value;
  }
  return trajectoryMetadataSchema.safeParse(parsed);
}

/** A JSON field (species → element answers) as its value; text that is not JSON is left for the schema to refuse by name. */
function jsonOrText(value: string): unknown {
  try {
    return JSON.parse(value);
  } catch {
    return value;
  }
}

export function trajectoryRoutes(ctx: AppContext): RouteDef[] {
  const limits = apiRateLimits(ctx);
  return [
    {
      method: 'get', path: '/upload-policy', access: { kind: 'signed-in' },
      summary: 'The largest file an upload may carry, and the limits on reading a compressed one, so a client can refuse a file before sending it.',
      response: wrapped('uploadPolicy', uploadPolicySchema),
      handler: (_req, res) => {
        const limits: UploadPolicy = {
          fileMaxBytes: ctx.config.UPLOAD_MAX_BYTES, decompressedMaxBytes: ctx.config.DECOMPRESSED_MAX_BYTES, decompressionMaxRatio: ctx.config.DECOMPRESSION_MAX_RATIO,
        };
        res.json({ uploadPolicy: limits });
      },
    },
    {
      method: 'get', path: '/projects/:id/trajectories', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: "The project's trajectories with what inspection found and their metadata, newest first.",
      response: wrapped('trajectories', z.array(trajectorySchema)),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ trajectories: await listTrajectories(ctx, id) });
      },
    },
    {
      method: 'post', path: '/projects/:id/trajectories', access: { kind: 'project', role: 'editor', via: 'project' },
      summary: 'Uploads a trajectory (multipart, field `file`, plus optional metadata fields): streamed to storage, checksummed, queued for inspection.',
      request: { upload: { fileField: 'file', fields: trajectoryMetadataSchema } },
      response: wrapped('trajectory', trajectorySchema, 201),
      // Streams while multer reads the body; `before` runs after the access check, so nothing is stored for a caller without rights.
      before: [limits.uploads, trajectoryUpload(ctx)],
      handler: async (req, res) => {
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
          res.status(201).json({ trajectory: await completeUpload(ctx, stored, metadata.data) });
        } catch (err) {
          // Whatever failed after the bytes were stored, the upload is undone rather than left `uploading`.
          await abandonUpload(ctx, stored.trajectoryId, stored.objectKey).catch(() => {});
          throw err;
        }
      },
    },
    {
      method: 'patch', path: '/projects/:id/trajectories', access: { kind: 'project', role: 'editor', via: 'project' },
      summary: 'One metadata change for several trajectories of the project, all or none; names are not changed this way.',
      request: { body: bulkMetadataBody }, response: wrapped('trajectories', z.array(trajectorySchema)),
      handler: async (req, res) => {
        const { ids, changes } = body(req, bulkMetadataBody);
        res.json({ trajectories: await updateMetadataOfMany(ctx, authorizedProject(res).projectId, ids, changes) });
      },
    },
    {
      method: 'get', path: '/trajectories/:id', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      summary: 'One trajectory: status uploading → inspecting → ready | failed (with the reader\'s message), atoms, frames, species, cell, time step; `fromFile` lists values read from the file.',
      response: wrapped('trajectory', trajectorySchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ trajectory: await getTrajectory(ctx, id) });
      },
    },
    {
      method: 'patch', path: '/trajectories/:id', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      summary: 'Corrects metadata; a value typed in is no longer marked as read from the file.',
      request: { body: trajectoryMetadataSchema }, response: wrapped('trajectory', trajectorySchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ trajectory: await updateMetadata(ctx, id, body(req, trajectoryMetadataSchema)) });
      },
    },
    {
      method: 'delete', path: '/trajectories/:id', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      summary: 'Removes a trajectory with its stored file.',
      response: noContent,
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        await deleteTrajectory(ctx, id);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/trajectories/:id/frames', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      summary: 'Positions for the frame viewer, as binary.',
      request: { query: frameRangeQuery },
      response: download('application/octet-stream',
        'A uint32 LE header length, a JSON header (atoms, species, per-frame index, time and cell), then Float32 LE positions in Å.'),
      handler: async (req, res) => {
        const row = authorizedTrajectory(res);
        const answer = framesAnswer(ctx, row, query(req, frameRangeQuery));
        res.type('application/octet-stream').setHeader('Cache-Control', 'private, max-age=3600');
        // Set before sending, so Express does not hash the body for one; a browser revalidating gets a 304 without it.
        res.setHeader('ETag', answer.etag);
        if (req.fresh) {
          res.status(304).end();
          return;
        }
        res.send(await answer.payload());
      },
    },
    {
      method: 'get', path: '/trajectories/:id/cut', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      summary: 'A frame range (0-based, `to` exclusive) as extended XYZ.',
      request: { query: frameRangeQuery },
      response: download('text/plain', 'Extended XYZ: one block per frame, with the cell in Lattice= and velocities when the file has them.'),
      handler: async (req, res) => {
        const row = authorizedTrajectory(res);
        const range = query(req, frameRangeQuery);
        const chunks = extxyzCut(ctx, row, range);
        const first = await chunks.next();
        // The name as uploaded, in filename* (RFC 6266/8187), with an ASCII fallback for old clients.
        res.attachment(cutFileName(row.name, row.frames ?? 0, range));
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
