import { z } from 'zod'
import { text } from './text'
import { piecesSchema } from './firing'

const notes = text().trim().max(2000, 'Keep the notes under 2000 characters.')

export const requestCreateSchema = z.object({ pieces: piecesSchema, notes: notes.optional() })
export type RequestCreateBody = z.infer<typeof requestCreateSchema>

export const requestPatchSchema = z.object({ pieces: piecesSchema.optional(), notes: notes.optional() })

export const requestSendSchema = z.object({
  acknowledged: z.array(text().max(60)).max(50).default([]),
  agreePolicies: z.literal(true, { error: 'Agree to the studio’s terms to send your ask.' }),
  policiesVersion: z.number({ error: 'Say which version of the terms you agreed to.' }).int().min(1),
})

export const requestDeclineSchema = z.object({
  reason: text({ error: 'Tell the potter why.' }).trim().min(3, 'Tell the potter why, in a few words.').max(500),
})

export const requestMoveSchema = z.object({ firingId: z.uuid({ error: 'Choose a firing.' }) })

export const requestWithdrawSchema = z.object({ reason: text().trim().max(500).optional() })

export const messageSchema = z.object({
  body: text({ error: 'Write a message.' }).trim().min(1, 'Write a message.').max(4000, 'Keep a message under 4000 characters.'),
})

export const depositSchema = z.object({
  /** Keep the card this deposit is paid with, to pay a damage claim on this ask the potter accepts. */
  keepCard: z.boolean({ error: 'Say yes or no to keeping the card.' }).default(false),
})

export const disputeSchema = z.object({
  reason: text({ error: 'Say what went wrong.' }).trim().min(5, 'Say what went wrong, in a sentence.').max(2000),
})

export const adminRefundSchema = z.object({
  amountCents: z.number({ error: 'Enter the refund in cents.' }).int('Whole cents.').positive('Enter more than 0.'),
  reason: text().trim().min(3, 'Say why.').max(500),
})
