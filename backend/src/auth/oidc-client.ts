import * as client from 'openid-client';
import type { Env } from '../config/env';
import { serviceUnavailable } from '../errors';

/** Relying-party side of OpenID Connect: discovery is cached, and retried after a failure. */
export class OidcClient {
  private config: Promise<client.Configuration> | null = null;

  constructor(private readonly e: Pick<Env, 'OIDC_ISSUER' | 'OIDC_CLIENT_ID' | 'OIDC_CLIENT_SECRET' | 'OIDC_ALLOW_INSECURE' | 'OIDC_SCOPES' | 'PUBLIC_URL'>) {}

  get redirectUri(): string {
    return new URL('/auth/callback', this.e.PUBLIC_URL).href;
  }

  get postLogoutRedirectUri(): string {
    return new URL('/signed-out', this.e.PUBLIC_URL).href;
  }

  private async discover(): Promise<client.Configuration> {
    const options = this.e.OIDC_ALLOW_INSECURE ? { execute: [client.allowInsecureRequests] } : undefined;
    const auth = this.e.OIDC_CLIENT_SECRET ? client.ClientSecretPost(this.e.OIDC_CLIENT_SECRET) : client.None();
    return client.discovery(new URL(this.e.OIDC_ISSUER), this.e.OIDC_CLIENT_ID, undefined, auth, options);
  }

  async configuration(): Promise<client.Configuration> {
    if (!this.config) {
      this.config = this.discover().catch((err) => {
        this.config = null;
        throw err;
      });
    }
    try {
      return await this.config;
    } catch {
      throw serviceUnavailable('The identity provider cannot be reached. Try again shortly.');
    }
  }

  async startSignIn(): Promise<{ url: string; state: string; codeVerifier: string }> {
    const config = await this.configuration();
    const codeVerifier = client.randomPKCECodeVerifier();
    const state = client.randomState();
    const url = client.buildAuthorizationUrl(config, {
      redirect_uri: this.redirectUri,
      scope: this.e.OIDC_SCOPES,
      code_challenge: await client.calculatePKCECodeChallenge(codeVerifier),
      code_challenge_method: 'S256',
      state,
    });
    return { url: url.href, state, codeVerifier };
  }

  async finishSignIn(currentUrl: URL, expected: { state: string; codeVerifier: string }) {
    const config = await this.configuration();
    const tokens = await client.authorizationCodeGrant(config, currentUrl, {
      pkceCodeVerifier: expected.codeVerifier,
      expectedState: expected.state,
    });
    const claims = tokens.claims();
    if (!claims) throw new Error('The identity provider returned no ID token.');
    return {
      issuer: String(claims.iss),
      subject: String(claims.sub),
      email: typeof claims.email === 'string' ? claims.email : null,
      name: typeof claims.name === 'string' ? claims.name : null,
      idToken: tokens.id_token ?? null,
    };
  }

  /** Where to send the browser so the provider's session ends too; null when it has no such endpoint. */
  async endSessionUrl(idToken: string | null): Promise<string | null> {
    const config = await this.configuration();
    if (!config.serverMetadata().end_session_endpoint) return null;
    const params: Record<string, string> = { post_logout_redirect_uri: this.postLogoutRedirectUri, client_id: this.e.OIDC_CLIENT_ID };
    if (idToken) params.id_token_hint = idToken;
    return client.buildEndSessionUrl(config, params).href;
  }
}
