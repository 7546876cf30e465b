/** Text a user typed, made literal inside a LIKE pattern (%, _ and \ lose their meaning). */
export const likeLiteral = (typed: string) => typed.replace(/[%_\\]/g, '\\$&');
