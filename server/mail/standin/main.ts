// Runs the SMTP stand-in as a process: `tsx server/mail/standin/main.ts`. SMTP_PORT picks the port
// (default 2525); DATABASE_URL is where it keeps what it receives.
import { startMailStandin } from './server.ts';
import { DEV_SMTP_PORT } from '../transport.ts';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) throw new Error('The mail stand-in needs DATABASE_URL to keep what it receives.');
const standin = await startMailStandin({ port: Number(process.env.SMTP_PORT ?? DEV_SMTP_PORT), databaseUrl });
console.log(`mail stand-in listening on ${standin.url}`);

const shutdown = () => standin.close().then(() => process.exit(0), () => process.exit(1));
process.once('SIGTERM', shutdown);
process.once('SIGINT', shutdown);
process.once('SIGHUP', shutdown);
