import * as client from 'openid-client';
import type { Config } from '../../lib/config';
import { AppError } from '../../lib/errors';

let cached: { issuer: string; configuration: client.Configuration } | null = null;

/**
 * The identity provider's metadata, discovered on first use and kept. When the provider cannot be
 * reached the sign-in fails with a 503 that says so; signed-in sessions do not depend on it.
 */
export async function oidcConfiguration(config: Config): Promise<client.Configuration> {
  if (cached && cached.issuer === config.oidc.issuer) return cached.configuration;
  try {
    const configuration = await client.discovery(
      new URL(config.oidc.issuer),
      config.oidc.clientId,
      config.oidc.clientSecret,
      client.ClientSecretBasic(config.oidc.clientSecret),
      // Plain http is allowed only for the local provider on loopback (development and tests).
      config.production ? undefined : { execute: [client.allowInsecureRequests], timeout: 5 },
    );
    cached = { issuer: config.oidc.issuer, configuration };
    return configuration;
  } catch (error) {
    throw new AppError(
      'identity_provider_unavailable',
      503,
      'The sign-in service cannot be reached right now. If you are already signed in you can keep working; otherwise please try again in a few minutes or tell your administrator.',
      { cause: (error as Error).message },
    );
  }
}

export function forgetOidcConfiguration(): void {
  cached = null;
}

export { client };
