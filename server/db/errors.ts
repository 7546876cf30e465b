// What PostgreSQL said, read the same way everywhere (drizzle wraps the driver's error in `cause`).

/** The SQLSTATE of a database error (e.g. 23505 unique violation), if it is one. */
export const pgCode = (e: unknown): string | undefined => {
  const x = e as { code?: string; cause?: { code?: string } };
  return x?.cause?.code ?? x?.code;
};

/** The constraint a database error names, if any. */
export const pgConstraint = (e: unknown): string | undefined => {
  const x = e as { constraint?: string; cause?: { constraint?: string } };
  return x?.cause?.constraint ?? x?.constraint;
};

const UUID_RE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A path id that can name a row (anything else is "not found" without asking the database). */
export const isUuid = (id: string) => UUID_RE.test(id);
