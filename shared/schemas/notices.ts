import { z } from 'zod'

/** Marks notices read: some by id, or all of them. */
export const noticesReadSchema = z.union([
  z
    .object({
      ids: z
        .array(z.uuid({ error: 'Not a notice id.' }))
        .min(1)
        .max(200),
    })
    .strict(),
  z.object({ all: z.literal(true) }).strict(),
])
export type NoticesReadBody = z.infer<typeof noticesReadSchema>
