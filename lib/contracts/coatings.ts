import { z } from 'zod';
import {
  codeText,
  recordReplies,
  id,
  listQuerySchema,
  recordColumns,
  requiredText,
  text,
  updateSchema,
} from './common';

/** /api/coatings and /api/coatings/[id]: products and formulations under test. */

const coatingShape = {
  code: codeText(
    32,
    'Enter a coating code, like HT-200.',
    'Keep the coating code to 32 characters or fewer.',
    'Use letters, digits, spaces and . _ / - in the coating code, starting with a letter or digit.',
  ),
  name: requiredText(120, 'Enter the coating name, like "Hydrophobic topcoat".'),
  description: text(2000),
};

export const coatingCreateSchema = z.object({
  ...coatingShape,
  description: coatingShape.description.optional(),
});
export const coatingUpdateSchema = updateSchema(coatingShape);
export type CoatingCreate = z.output<typeof coatingCreateSchema>;
export type CoatingUpdate = z.output<typeof coatingUpdateSchema>;

export const coatingListQuerySchema = listQuerySchema({
  sort: ['code', 'name', 'createdAt', 'updatedAt'],
  defaultSort: 'code',
  defaultDir: 'asc',
  filters: {},
});
export type CoatingListQuery = z.output<typeof coatingListQuerySchema>;

export const coatingSchema = z.object({
  ...recordColumns,
  code: z.string(),
  name: z.string(),
  description: z.string(),
  createdByUserId: id.nullable(),
});
export type Coating = z.output<typeof coatingSchema>;

/** GET list → page, POST/GET/PATCH → one, DELETE → deleted. */
export const coatingReplies = recordReplies('coating', coatingSchema, coatingSchema);

/** PUT/DELETE (and GET) /api/coatings/[id]/watch: whether the user gets out-of-spec mails. */
export const watchReplySchema = z.object({ watching: z.boolean() });
