// Ports for the local run; plain JavaScript so the bootstrap needs no TypeScript.
import { readFileSync } from 'node:fs';

export const DEMO_SIGN_INS = JSON.parse(readFileSync(new URL('../../seed/demo-sign-ins.json', import.meta.url), 'utf8'));
export const DEV_PG_PORT = 54320;
export const DEV_SEARCH_PORT = 7701;
export const DEV_SMTP_PORT = 2525; // server/mail/transport.ts says the same
export const DEV_PAY_PORT = 12112; // server/payments/provider.ts says the same
export const TEST_PG_PORT = 54330;
// The search stand-in keeps its index in memory: a bounded heap keeps it near its live size (about
// 180 MB at 50,000 parts) instead of growing with the garbage of each search. Larger catalogues
// belong on a real Meilisearch server.
export const STANDIN_NODE_OPTIONS = `${process.env.NODE_OPTIONS ?? ''} --max-old-space-size=256`.trim();
