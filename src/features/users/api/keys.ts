export const userKeys = {
  all: ['users'] as const,
  list: (q: string) => [...userKeys.all, 'list', q] as const,
  companies: () => [...userKeys.all, 'companies'] as const,
};
