// Runs the payment stand-in as a process: `tsx server/payments/standin/main.ts`. PAY_PORT picks
// the port (default 12112); PAY_WEBHOOK_URL is the app's webhook, where paid checkouts are announced.
import { startPaymentStandin } from './server.ts';
import { DEV_PAY_PORT, STANDIN_SECRET_KEY, STANDIN_WEBHOOK_SECRET } from '../provider.ts';

const standin = await startPaymentStandin({
  port: Number(process.env.PAY_PORT ?? DEV_PAY_PORT),
  secretKey: process.env.STRIPE_SECRET_KEY ?? STANDIN_SECRET_KEY,
  webhookSecret: process.env.STRIPE_WEBHOOK_SECRET ?? STANDIN_WEBHOOK_SECRET,
  webhookUrl: process.env.PAY_WEBHOOK_URL ?? null,
});
console.log(`payment stand-in listening on ${standin.url}`);

const shutdown = () => standin.close().then(() => process.exit(0), () => process.exit(1));
process.once('SIGTERM', shutdown);
process.once('SIGINT', shutdown);
process.once('SIGHUP', shutdown);
