/** GET /api/health: whether the instance and the services it depends on answer. */
import { z } from 'zod';

export const serviceStatusSchema = z.object({ status: z.enum(['ok', 'down']), reason: z.string().optional() });
export type ServiceStatus = z.infer<typeof serviceStatusSchema>;

export const healthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string(),
  services: z.object({ database: serviceStatusSchema, queue: serviceStatusSchema, storage: serviceStatusSchema, mail: serviceStatusSchema }),
});
export type HealthReport = z.infer<typeof healthSchema>;
