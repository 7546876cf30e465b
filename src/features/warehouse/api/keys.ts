export const warehouseKeys = {
  all: ['warehouse'] as const,
  queue: () => [...warehouseKeys.all, 'pick-queue'] as const,
  pick: (jobId: string) => [...warehouseKeys.all, 'pick', jobId] as const,
  labels: (jobId: string) => [...warehouseKeys.all, 'labels', jobId] as const,
  handover: (jobId: string) => [...warehouseKeys.all, 'handover', jobId] as const,
};
