import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import { Type } from 'typebox';
import { TOKEN_COOKIE, tokenMatches } from '../access.ts';

/**
 * POST /login: the sign-in form's token becomes an HttpOnly, SameSite=Strict cookie, so the page's
 * own requests carry it and no other site's requests do.
 * @example await app.register(loginRoutes, { token })
 */
export const loginRoutes: FastifyPluginAsyncTypebox<{ token: string }> = async (scope, { token }) => {
  scope.addContentTypeParser('application/x-www-form-urlencoded', { parseAs: 'string', bodyLimit: 4096 }, (_request, body, done) => {
    done(null, Object.fromEntries(new URLSearchParams(body as string)));
  });
  scope.post(
    '/login',
    {
      schema: {
        hide: true,
        body: Type.Object({ token: Type.String({ maxLength: 1000 }) }),
      },
    },
    async (request, reply) => {
      if (!tokenMatches(token, request.body.token.trim())) return reply.redirect('/login?failed', 303);
      reply.header('set-cookie', `${TOKEN_COOKIE}=${encodeURIComponent(token)}; HttpOnly; SameSite=Strict; Path=/`);
      return reply.redirect('/', 303);
    },
  );
};
