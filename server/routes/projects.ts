import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { createProject, deleteProject, getProject, listProjects, updateProject } from '../services/projects.ts';
import { PROJECT_DESCRIPTION_MAX_LENGTH, PROJECT_NAME_MAX_LENGTH } from '../../shared/account-rules.ts';
import { body } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const name = z.string({ error: 'is required' }).trim().min(1, 'must not be empty')
  .max(PROJECT_NAME_MAX_LENGTH, `must be at most ${PROJECT_NAME_MAX_LENGTH} characters`);
const description = z.string({ error: 'must be text' }).trim()
  .max(PROJECT_DESCRIPTION_MAX_LENGTH, `must be at most ${PROJECT_DESCRIPTION_MAX_LENGTH} characters`);
const createBody = z.object({ name, description: description.default('') }).strict();
const updateBody = z.object({ name: name.optional(), description: description.optional() }).strict()
  .refine((b) => b.name !== undefined || b.description !== undefined, 'send name, description or both');
const deleteBody = z.object({ confirm: z.string({ error: "is required: type the project's name" }) }).strict();

export function projectRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects', access: { kind: 'signed-in' },
      handler: async (req, res) => {
        res.json({ projects: await listProjects(ctx.db, currentUser(req).id) });
      },
    },
    {
      method: 'post', path: '/projects', access: { kind: 'signed-in' },
      handler: async (req, res) => {
        res.status(201).json({ project: await createProject(ctx.db, currentUser(req).id, body(req, createBody)) });
      },
    },
    {
      method: 'get', path: '/projects/:id', access: { kind: 'project', role: 'viewer', via: 'project' },
      handler: async (req, res) => {
        res.json({ project: await getProject(ctx.db, authorizedProject(res).projectId, currentUser(req).id) });
      },
    },
    {
      method: 'patch', path: '/projects/:id', access: { kind: 'project', role: 'editor', via: 'project' },
      handler: async (req, res) => {
        const changes = body(req, updateBody);
        res.json({ project: await updateProject(ctx.db, authorizedProject(res).projectId, currentUser(req).id, changes) });
      },
    },
    {
      method: 'delete', path: '/projects/:id', access: { kind: 'project', role: 'owner', via: 'project' },
      handler: async (req, res) => {
        const { confirm } = body(req, deleteBody);
        await deleteProject(ctx, authorizedProject(res).projectId, currentUser(req).id, confirm);
        res.status(204).end();
      },
    },
  ];
}
