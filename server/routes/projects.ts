import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { createProject, deleteProject, getProject, listProjects, updateProject } from '../services/projects.ts';
import { createProjectBody, deleteProjectBody, projectSchema, updateProjectBody } from '../../shared/projects.ts';
import { body } from './request-parts.ts';
import { noContent, wrapped, type RouteDef } from './route-table.ts';

export function projectRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects', access: { kind: 'signed-in' },
      summary: 'Your projects: name, your role, member count, last activity.',
      response: wrapped('projects', z.array(projectSchema)),
      handler: async (req, res) => {
        res.json({ projects: await listProjects(ctx.db, currentUser(req).id) });
      },
    },
    {
      method: 'post', path: '/projects', access: { kind: 'signed-in' },
      summary: 'A new project you own.',
      request: { body: createProjectBody }, response: wrapped('project', projectSchema, 201),
      handler: async (req, res) => {
        res.status(201).json({ project: await createProject(ctx.db, currentUser(req).id, body(req, createProjectBody)) });
      },
    },
    {
      method: 'get', path: '/projects/:id', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: 'One project with your role.',
      response: wrapped('project', projectSchema),
      handler: async (req, res) => {
        res.json({ project: await getProject(ctx.db, authorizedProject(res).projectId, currentUser(req).id) });
      },
    },
    {
      method: 'patch', path: '/projects/:id', access: { kind: 'project', role: 'editor', via: 'project' },
      summary: "Renames a project or changes its description.",
      request: { body: updateProjectBody }, response: wrapped('project', projectSchema),
      handler: async (req, res) => {
        const changes = body(req, updateProjectBody);
        res.json({ project: await updateProject(ctx.db, authorizedProject(res).projectId, currentUser(req).id, changes) });
      },
    },
    {
      method: 'delete', path: '/projects/:id', access: { kind: 'project', role: 'owner', via: 'project' },
      summary: "Deletes a project with everything in it, once its exact name is given in `confirm`.",
      request: { body: deleteProjectBody }, response: noContent,
      handler: async (req, res) => {
        const { confirm } = body(req, deleteProjectBody);
        await deleteProject(ctx, authorizedProject(res).projectId, currentUser(req).id, confirm);
        res.status(204).end();
      },
    },
  ];
}
