import type { Actor } from '../policies/actor.ts';

declare global {
  namespace Express {
    interface Request {
      id: string;
      actor?: Actor;
    }
  }
}
export {};
