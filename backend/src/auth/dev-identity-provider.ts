import http from 'node:http';
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { generateKeyPair, exportJWK } from 'jose';
import Provider, { type Configuration, type KoaContextWithOIDC } from 'oidc-provider';
import type { DemoAccount } from '../seed/demo-accounts';

/**
 * A local OpenID Connect provider for development and tests: one public client with PKCE, RS256
 * keys made at start, and a small sign-in page of its own that checks the demo passwords.
 * It is never started in production.
 */
export interface DevIdentityProvider {
  issuer: string;
  stop(): Promise<void>;
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${esc(title)}</title><style>
body{font:16px/1.5 system-ui,sans-serif;background:#f4f1ea;color:#1d2430;margin:0;display:grid;place-items:center;min-height:100vh}
main{background:#fff;border:1px solid #d8d2c4;border-radius:8px;padding:2rem;width:min(24rem,90vw);box-shadow:0 1px 3px rgba(0,0,0,.08)}
h1{font-size:1.25rem;margin:0 0 .25rem}p{margin:.25rem 0 1rem;color:#4b5563}
label{display:block;font-weight:600;margin:.75rem 0 .25rem}input{width:100%;box-sizing:border-box;padding:.5rem;border:1px solid #9ca3af;border-radius:4px;font:inherit}
input:focus,button:focus{outline:3px solid #2f5d8a;outline-offset:2px}
button{margin-top:1.25rem;width:100%;padding:.6rem;border:0;border-radius:4px;background:#1f3b5c;color:#fff;font:inherit;font-weight:600;cursor:pointer}
.err{color:#9b1c1c;background:#fdecec;border:1px solid #f5c2c2;padding:.5rem;border-radius:4px}
small{display:block;margin-top:1rem;color:#6b7280}</style></head><body><main>${body}</main></body></html>`;
}

function loginForm(uid: string, error?: string, email = ''): string {
  return page(
    'Sign in — local identity provider',
    `<h1>Local identity provider</h1><p>Development sign-in for Toneledger.</p>
${error ? `<p class="err" role="alert">${esc(error)}</p>` : ''}
<form method="post" action="/interaction/${esc(uid)}/login" autocomplete="off">
<label for="email">E-mail</label><input id="email" name="email" type="email" required value="${esc(email)}" autofocus>
<label for="password">Password</label><input id="password" name="password" type="password" required>
<button type="submit">Continue</button></form>
<small>The demo accounts and passwords are printed when Toneledger starts.</small>`,
  );
}

function readForm(req: http.IncomingMessage): Promise<URLSearchParams> {
  return new Promise((resolve, reject) => {
    let data = '';
    req.setEncoding('utf8');
    req.on('data', (chunk: string) => {
      data += chunk;
      if (data.length > 10_000) req.destroy(new Error('form too large'));
    });
    req.on('end', () => resolve(new URLSearchParams(data)));
    req.on('error', reject);
  });
}

function same(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

export async function startDevIdentityProvider(options: {
  port: number;
  host?: string;
  clientId: string;
  redirectUris: string[];
  postLogoutRedirectUris: string[];
  accounts: DemoAccount[];
}): Promise<DevIdentityProvider> {
  const host = options.host ?? '127.0.0.1';
  const server = http.createServer();
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, host, () => resolve());
  });
  const port = (server.address() as { port: number }).port;
  const issuer = `http://${host}:${port}`;

  const { privateKey } = await generateKeyPair('RS256', { extractable: true });
  const jwk = { ...(await exportJWK(privateKey)), alg: 'RS256', use: 'sig', kid: randomBytes(8).toString('hex') };
  const byId = new Map(options.accounts.map((a) => [a.id, a]));

  const configuration: Configuration = {
    clients: [
      {
        client_id: options.clientId,
        token_endpoint_auth_method: 'none',
        redirect_uris: options.redirectUris,
        post_logout_redirect_uris: options.postLogoutRedirectUris,
        response_types: ['code'],
        grant_types: ['authorization_code'],
      },
    ],
    pkce: { required: () => true },
    jwks: { keys: [jwk as never] },
    cookies: { keys: [randomBytes(32).toString('hex')] },
    claims: { openid: ['sub'], email: ['email', 'email_verified'], profile: ['name'] },
    conformIdTokenClaims: false,
    findAccount: async (_ctx: KoaContextWithOIDC, id: string) => {
      const a = byId.get(id);
      if (!a) return undefined;
      return { accountId: id, claims: async () => ({ sub: id, email: a.email, email_verified: true, name: a.name }) };
    },
    interactions: { url: (_ctx, interaction) => `/interaction/${interaction.uid}` },
    features: {
      devInteractions: { enabled: false },
      rpInitiatedLogout: {
        enabled: true,
        // Signing out of Toneledger signs out of this provider too, without a second question.
        logoutSource: async (ctx, form) => {
          ctx.body = page(
            'Signing out',
            `${form}<h1>Signing out…</h1><noscript><button form="op.logoutForm" name="logout" value="yes">Sign out</button></noscript>` +
              `<script src="/interaction-assets/logout.js"></script>`,
          );
        },
      },
    },
    ttl: { Session: 12 * 3600, Interaction: 600, Grant: 12 * 3600, IdToken: 3600, AccessToken: 3600, AuthorizationCode: 60 },
    renderError: async (ctx, out) => {
      ctx.type = 'html';
      ctx.body = page('Sign-in problem', `<h1>Sign-in problem</h1><p class="err">${esc(String(out.error_description ?? out.error))}</p>`);
    },
  };
  const provider = new Provider(issuer, configuration);
  provider.on('server_error', (_ctx, err) => console.error('[identity]', err));
  const callback = provider.callback();

  server.on('request', async (req, res) => {
    const url = new URL(req.url ?? '/', issuer);
    const m = url.pathname.match(/^\/interaction\/([A-Za-z0-9_-]+)(\/login)?$/);
    try {
      if (url.pathname === '/favicon.ico') {
        res.writeHead(204).end();
        return;
      }
      if (url.pathname === '/interaction-assets/logout.js') {
        res.writeHead(200, { 'content-type': 'text/javascript' });
        res.end(
          "var f=document.getElementById('op.logoutForm');var i=document.createElement('input');i.type='hidden';i.name='logout';i.value='yes';f.appendChild(i);f.submit();",
        );
        return;
      }
      if (!m) return callback(req, res);
      const details = await provider.interactionDetails(req, res);
      if (details.uid !== m[1]) throw new Error('interaction mismatch');
      if (details.prompt.name === 'consent') {
        // First-party client: consent is implied; record the grant and continue.
        const accountId = details.session!.accountId;
        const grant = details.grantId ? await provider.Grant.find(details.grantId) : new provider.Grant({ accountId, clientId: String(details.params.client_id) });
        grant!.addOIDCScope(String(details.params.scope ?? 'openid'));
        const grantId = await grant!.save();
        return provider.interactionFinished(req, res, { consent: { grantId } }, { mergeWithLastSubmission: true });
      }
      if (req.method === 'GET' && !m[2]) {
        res.writeHead(200, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' });
        res.end(loginForm(details.uid));
        return;
      }
      if (req.method === 'POST' && m[2]) {
        const form = await readForm(req);
        const email = (form.get('email') ?? '').trim().toLowerCase();
        const account = options.accounts.find((a) => a.email.toLowerCase() === email);
        if (!account || !same(form.get('password') ?? '', account.password)) {
          res.writeHead(200, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' });
          res.end(loginForm(details.uid, 'That e-mail and password do not match a demo account.', email));
          return;
        }
        return provider.interactionFinished(req, res, { login: { accountId: account.id } }, { mergeWithLastSubmission: false });
      }
      res.writeHead(405).end();
    } catch (err) {
      res.writeHead(400, { 'content-type': 'text/html; charset=utf-8' });
      res.end(page('Sign-in problem', `<h1>Sign-in problem</h1><p class="err">${esc(err instanceof Error ? err.message : 'error')}</p><p>Start again from Toneledger.</p>`));
    }
  });

  return {
    issuer,
    stop: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
