import { z } from 'zod';

/** `:id` and friends: positive integers only. */
export const idSchema = z.coerce.number().int().positive();
export const idParams = z.object({ id: idSchema });
