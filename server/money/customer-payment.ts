import "server-only";
import type { DB } from "@/db";
import { paymentsConfigured } from "@/server/payments/service";
import { jobInvoices } from "./invoices";
import { loadJobMoney } from "./job-money";
import { amountOwed } from "./payments";
import { balanceDueCents, invoiceOutOfDate } from "./state";

/** What the truck owner's page says about paying: what is owed now, and what was paid. */
export interface CustomerPayment {
  /** The shop takes card payments online. */
  online: boolean;
  /** `restCents`: what the approved work still costs after what was paid, owed at pickup. */
  deposit: { askedCents: number; paidCents: number; owedCents: number; restCents: number } | null;
  /** `outOfDate`: a change order was approved after it; the shop makes it again, and it asks no payment until then. */
  invoice: { number: string; status: "open" | "paid" | "on_account"; totalCents: number; receivedCents: number; balanceCents: number; outOfDate: boolean } | null;
}

export async function customerPayment(db: DB, jobId: number): Promise<CustomerPayment | null> {
  const m = (await loadJobMoney(db, [jobId])).get(jobId)!;
  if (m.quoteStatus !== "approved") return null;
  const [inv] = await jobInvoices(db, jobId);
  return {
    online: paymentsConfigured(),
    deposit: m.depositAskedCents > 0 ? { askedCents: m.depositAskedCents, paidCents: m.depositReceivedCents, owedCents: amountOwed(m, "deposit"), restCents: Math.max(0, balanceDueCents(m)) } : null,
    invoice: inv && inv.status !== "void" ? { number: inv.number, status: inv.status, totalCents: inv.totalCents, receivedCents: inv.depositsCents + inv.paidCents, balanceCents: Math.max(0, inv.balanceCents), outOfDate: invoiceOutOfDate(m) } : null,
  };
}
