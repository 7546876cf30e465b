import Stripe from 'stripe';

export interface PaymentProviderConfig {
  secretKey: string;
  webhookSecret: string;
  /** http://127.0.0.1:12112 for the local stand-in; unset for the real provider. */
  apiBase?: string;
}

/**
 * The provider's official SDK. With `apiBase` every call goes to the local stand-in
 * (server/payments/standin); without it, to the provider itself (the keys decide test or live).
 */
export function createPaymentProvider({ secretKey, apiBase }: PaymentProviderConfig): Stripe {
  if (!apiBase) return new Stripe(secretKey, { maxNetworkRetries: 2, timeout: 20_000 });
  const url = new URL(apiBase);
  return new Stripe(secretKey, { host: url.hostname, port: Number(url.port || (url.protocol === 'https:' ? 443 : 80)), protocol: url.protocol === 'https:' ? 'https' : 'http', maxNetworkRetries: 0, timeout: 10_000 });
}

export const DEV_PAY_PORT = 12112;
export const STANDIN_SECRET_KEY = 'sk_test_stackyard_standin';
export const STANDIN_WEBHOOK_SECRET = 'whsec_stackyard_standin';
