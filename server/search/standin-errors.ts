// Errors in the shape Meilisearch v1 returns them, so the meilisearch client turns them into
// MeilisearchApiError (HTTP) or a failed task's `error` field exactly as a real server would.

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

  /** The same error raised by query `i` of a multi-search, whose message names the query. */
  inQuery(i: number): MeiliError {
    return new MeiliError(this.status, this.code, `Inside \`.queries[${i}]\`: ${this.message}`, this.type);
  }

  toBody(): MeiliErrorBody {
    return {
      message: this.message,
      code: this.code,
      type: this.type,
      link: `https://docs.meilisearch.com/errors#${this.code}`,
    };
  }
}

export function indexNotFound(uid: string): MeiliError {
  return new MeiliError(404, 'index_not_found', `Index \`${uid}\` not found.`);
}

export function notFilterable(attribute: string, filterable: string[], code: string): MeiliError {
  return new MeiliError(
    400,
    code,
    `Attribute \`${attribute}\` is not filterable. Available filterable attributes are: \`${filterable.join(', ')}\`.`,
  );
}

/** `filterableAttributes` → `filterable_attributes`, as used in Meilisearch error codes. */
export function snakeCase(name: string): string {
  return name.replace(/[A-Z]/g, (letter) => `_${letter.toLowerCase()}`);
}
