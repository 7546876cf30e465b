import type { PreviewQuery } from '@shared/contracts/purchasing.ts';

export const purchasingKeys = {
  all: ['purchasing'] as const,
  suppliers: () => [...purchasingKeys.all, 'suppliers'] as const,
  supplierParts: (id: string) => [...purchasingKeys.all, 'suppliers', id, 'parts'] as const,
  history: (id: string, sku: string) => [...purchasingKeys.all, 'suppliers', id, 'history', sku] as const,
  priceLists: () => [...purchasingKeys.all, 'price-lists'] as const,
  priceList: (id: string) => [...purchasingKeys.all, 'price-lists', id] as const,
  preview: (id: string, q: Partial<PreviewQuery>) => [...purchasingKeys.all, 'price-lists', id, 'preview', q] as const,
  rules: () => [...purchasingKeys.all, 'rules'] as const,
  tiers: () => [...purchasingKeys.all, 'tiers'] as const,
  recomputes: () => [...purchasingKeys.all, 'recomputes'] as const,
  suggestions: () => [...purchasingKeys.all, 'suggestions'] as const,
  orders: () => [...purchasingKeys.all, 'orders'] as const,
  order: (id: string) => [...purchasingKeys.all, 'orders', id] as const,
};
