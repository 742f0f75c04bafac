import { z } from 'zod';
import { interactionPresetSchema, projectModelSchema, putInteractionModelSchema, trajectoryModelViewSchema } from '../../shared/interaction-model-api.ts';
import { INTERACTION_PRESETS } from '../../shared/interaction-presets.ts';
import type { AppContext } from '../context.ts';
import { projectModel, setProjectModel, setTrajectoryModel, trajectoryModelView } from '../services/interaction-models.ts';
import { body, idField, params } from './request-parts.ts';
import { wrapped, type RouteDef } from './route-table.ts';

export function interactionModelRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/interaction-model-presets', access: { kind: 'signed-in' },
      summary: 'Published pair-potential parameter sets, each with its source and whether its values were checked or are from memory.',
      response: wrapped('presets', z.array(interactionPresetSchema)),
      handler: (_req, res) => {
        res.json({ presets: INTERACTION_PRESETS });
      },
    },
    {
      method: 'get', path: '/trajectories/:id/interaction-model', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      summary: "The interaction model the energy analysis would use (the trajectory's own, else its project's), with every species pair resolved.",
      response: wrapped('interactionModel', trajectoryModelViewSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ interactionModel: await trajectoryModelView(ctx, id) });
      },
    },
    {
      method: 'put', path: '/trajectories/:id/interaction-model', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      summary: 'Stores an interaction model with the trajectory; 400 names each wrong field.',
      request: { body: putInteractionModelSchema }, response: wrapped('interactionModel', trajectoryModelViewSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { model } = body(req, putInteractionModelSchema);
        res.json({ interactionModel: await setTrajectoryModel(ctx, id, model) });
      },
    },
    {
      method: 'delete', path: '/trajectories/:id/interaction-model', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      summary: "Removes the trajectory's own model; its project's applies again.",
      response: wrapped('interactionModel', trajectoryModelViewSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ interactionModel: await setTrajectoryModel(ctx, id, null) });
      },
    },
    {
      method: 'get', path: '/projects/:id/interaction-model', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: "The project's interaction model, shared by its trajectories that have none of their own.",
      response: wrapped('interactionModel', projectModelSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ interactionModel: { model: await projectModel(ctx, id) } });
      },
    },
    {
      method: 'put', path: '/projects/:id/interaction-model', access: { kind: 'project', role: 'editor', via: 'project' },
      summary: "Stores the project's interaction model; 400 names each wrong field.",
      request: { body: putInteractionModelSchema }, response: wrapped('interactionModel', projectModelSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { model } = body(req, putInteractionModelSchema);
        res.json({ interactionModel: await setProjectModel(ctx, id, model) });
      },
    },
    {
      method: 'delete', path: '/projects/:id/interaction-model', access: { kind: 'project', role: 'editor', via: 'project' },
      summary: "Removes the project's interaction model.",
      response: wrapped('interactionModel', projectModelSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ interactionModel: await setProjectModel(ctx, id, null) });
      },
    },
  ];
}
