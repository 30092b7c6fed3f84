import type { APIRequestContext } from "playwright-core";
import { expect } from "vitest";
import { baseUrl } from "./browser";

async function ok<T = any>(res: Awaited<ReturnType<APIRequestContext["get"]>>, status = 200): Promise<T> {
  expect(res.status(), await res.text()).toBe(status);
  return (await res.json()) as T;
}

/**
 * Makes a job ready for work where money is not what a browser test is about: a quote of $1,000.00
 * sent, approved by the customer on the status link, and the deposit recorded in cash by the
 * office. `api` must be an office or owner's request context. Pass the job's current status link
 * when the test holds one (issuing a new link would turn it off); otherwise one is issued.
 */
export async function readyForWork(api: APIRequestContext, jobId: number, statusUrl?: string) {
  const headers = { origin: baseUrl() };
  const lines = [{ kind: "labour", description: "Upfit work", quantity: 8, unitPriceCents: 12_500, taxable: false }];
  const quote = (await ok(await api.post(`${baseUrl()}/api/jobs/${jobId}/quotes`, { headers, data: { lines } }), 201)).quote as { id: number };
  await ok(await api.post(`${baseUrl()}/api/quotes/${quote.id}/send`, { headers, data: {} }));
  const url = statusUrl ?? ((await ok(await api.post(`${baseUrl()}/api/jobs/${jobId}/status-links`, { headers }), 201)).link as { url: string }).url;
  const token = url.split("/status/")[1];
  // The customer's answer comes from their own browser, with no staff cookie.
  const answer = await fetch(`${baseUrl()}/status/${token}/quote`, { method: "POST", headers: { "content-type": "application/json", origin: baseUrl() }, body: JSON.stringify({ decision: "approve", quoteId: quote.id, name: "Test Customer", acceptTerms: true }) });
  expect(answer.status, await answer.text()).toBe(200);
  const money = await api.get(`${baseUrl()}/api/jobs/${jobId}/quotes`);
  const deposit = ((await ok(money)).quotes as { status: string; depositCents: number }[]).find((q) => q.status === "approved")!.depositCents;
  if (deposit > 0) await ok(await api.post(`${baseUrl()}/api/jobs/${jobId}/payments`, { headers, data: { purpose: "deposit", method: "cash", amountCents: deposit, reference: "" } }), 201);
}
