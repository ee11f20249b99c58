import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import { Type } from 'typebox';
import { methodChoices } from '../../georef/method-choices.ts';
import { oneOf } from '../schemas.ts';

/** One entry of the list (src/georef/method-choices.ts `MethodChoice`). */
export const methodChoiceSchema = Type.Object(
  {
    id: Type.String({ description: 'stable name of the choice' }),
    kind: oneOf(['method', 'service'], "'method' changes a georeference; 'service' is a limit of the program that never does"),
    choice: Type.String({ description: 'what is chosen' }),
    value: Type.Union([Type.Number(), Type.String()], { description: 'the value in force: a number (with unit) or a rule in words' }),
    unit: Type.Optional(Type.String()),
    source: Type.String({ description: 'the section of docs/method.md and the published source, or "common practice, no source"' }),
    changedBy: Type.String({ description: 'the CLI option, API field or batch setting that changes it, or "fixed"' }),
    where: Type.Array(Type.String(), { description: 'files that hold or apply it' }),
  },
  { additionalProperties: false },
);

/**
 * GET /api/v1/method: every choice the published method leaves open, with its value, source and what changes it
 * (the list `whereabouts method` prints).
 * @example await app.register(methodRoutes)
 */
export const methodRoutes: FastifyPluginAsyncTypebox = async (app) => {
  app.get(
    '/api/v1/method',
    {
      schema: {
        summary: 'Every choice the method leaves open: value in force, source, and the option that changes it',
        description: `The choices in force, one a line (id: choice = value; changed by):\n\n${methodChoices()
          .map((c) => `- \`${c.id}\`: ${c.choice} = ${c.value}${c.unit ? ` ${c.unit}` : ''}; changed by: ${c.changedBy}`)
          .join('\n')}`,
        tags: ['method'],
        // The list itself is in the document too, as the answer's example: the same values the route answers.
        response: { 200: Type.Array(methodChoiceSchema, { examples: [methodChoices()] }) },
      },
    },
    async () => methodChoices(),
  );
};
