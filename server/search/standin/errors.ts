// Errors in the shape Meilisearch answers them, so the meilisearch client raises MeilisearchApiError
// (or reports a failed task's `error`) exactly as it would against a real server.

export type MeiliErrorBody = { message: string; code: string; type: string; link: string };

export class MeiliError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly type: 'invalid_request' | 'auth' | 'internal' = 'invalid_request',
  ) {
    super(message);
  }

  toBody(): MeiliErrorBody {
    return { message: this.message, code: this.code, type: this.type, link: `https://docs.meilisearch.com/errors#${this.code}` };
  }
}

export const indexNotFound = (uid: string) => new MeiliError(404, 'index_not_found', `Index \`${uid}\` not found.`);
