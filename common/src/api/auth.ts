import { z } from 'zod';
import { dataEnvelope } from '../schemas/envelope';
import { emptyBodySchema } from '../schemas/primitives';
import { endpoint } from './endpoint';

/** Only paths inside this app: "/x", never "//host" or "/\host". */
export const returnToSchema = z
  .string()
  .max(2000)
  .regex(/^\/(?![/\\])[^\s]*$/, 'returnTo must be a path inside this application')
  .default('/');

export const authApi = {
  login: endpoint({
    method: 'get', path: '/auth/login', summary: 'Starts sign-in: redirects to the identity provider (authorization code flow with PKCE and state)',
    tags: ['session'], access: 'public', query: z.object({ returnTo: returnToSchema }), status: 302,
    response: { description: '302 to the identity provider' },
  }),
  callback: endpoint({
    method: 'get', path: '/auth/callback', summary: 'Where the identity provider returns; opens the session and redirects to returnTo',
    tags: ['session'], access: 'public', status: 302, response: { description: '302 into the application' },
  }),
  logout: endpoint({
    method: 'post', path: '/auth/logout', summary: "Ends the session here and returns the provider's end-session URL so its session ends too",
    tags: ['session'], access: 'public', body: emptyBodySchema,
    response: { description: 'Where to send the browser next', schema: dataEnvelope(z.object({ redirectTo: z.string() })) },
  }),
};
