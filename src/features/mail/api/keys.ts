export const mailKeys = {
  all: ['outbox'] as const,
  list: (to: string, page: number) => [...mailKeys.all, 'list', to, page] as const,
  detail: (id: string) => [...mailKeys.all, 'detail', id] as const,
};
