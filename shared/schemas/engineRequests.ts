import { z } from 'zod'
import { AssessInputSchema, SweepGridSchema } from './assess'

/** Body of POST /api/engine/sweep. */
export const SweepRequestSchema = z.object({ input: AssessInputSchema, grid: SweepGridSchema })

/** Body of POST /api/engine/sensitivity: the spread defaults to ±20 %. */
export const SensitivityRequestSchema = z.object({
  input: AssessInputSchema,
  fraction: z.number({ error: 'must be a number' }).positive('must be more than 0').max(0.9, 'must be 0.9 or less').default(0.2),
})
