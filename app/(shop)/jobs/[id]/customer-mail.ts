"use client";

import { useQueryClient } from "@tanstack/react-query";

/** React Query keys of the job page's customer e-mail list and status links. */
export const customerMailKeys = {
  messages: (jobId: number) => ["job", jobId, "messages"] as const,
  links: (jobId: number) => ["job", jobId, "status-links"] as const,
};

/**
 * After something that e-mails the customer (a quote or change order sent, an invoice made, a
 * payment taken), the job page's e-mail list and status link read again: the message is waiting to
 * send at once, and its link is issued as it goes.
 */
export function useCustomerMailRefresh(jobId: number) {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([queryClient.invalidateQueries({ queryKey: customerMailKeys.messages(jobId) }), queryClient.invalidateQueries({ queryKey: customerMailKeys.links(jobId) })]);
}
