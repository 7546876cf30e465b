// Ports for the local run; plain JavaScript so the bootstrap needs no TypeScript.
import { readFileSync } from 'node:fs';

export const DEMO_SIGN_INS = JSON.parse(readFileSync(new URL('../../seed/demo-sign-ins.json', import.meta.url), 'utf8'));
export const DEV_PG_PORT = 54320;
export const DEV_SEARCH_PORT = 7701;
export const TEST_PG_PORT = 54330;
