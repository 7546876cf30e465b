import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client.ts';

export const startPayment = (id: string) => api<{ data: { paymentId: string; checkoutUrl: string } }>(`/jobs/${encodeURIComponent(id)}/payments`, { method: 'POST' }).then((r) => r.data);

/** Opens the provider's checkout for the job: the answer is where to send the browser. */
export function useStartPayment(id: string) {
  return useMutation({ mutationFn: () => startPayment(id) });
}
