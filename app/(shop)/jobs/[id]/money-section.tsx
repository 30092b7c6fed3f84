import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { afterShell } from "@/server/http/after-shell";
import type { JobDetail } from "@/server/jobs/queries";
import { jobInvoices } from "@/server/money/invoices";
import { loadJobMoney } from "@/server/money/job-money";
import { amountOwed, listPayments } from "@/server/money/payments";
import { invoiceOutOfDate, moneyWords, outOfDateWords } from "@/server/money/state";
import { MoneyPanel } from "./money-panel";

/** What the customer owes and paid: the state in words, the invoice, the payments, and the counter's form. */
export async function MoneySection({ job, user, timeZone }: { job: JobDetail; user: StaffUser; timeZone: string }) {
  if (user.role === "tech") return null;
  await afterShell();
  const db = getDb();
  const [money, payments, invoices] = await Promise.all([loadJobMoney(db, [job.id]).then((m) => m.get(job.id)!), listPayments(db, job.id), jobInvoices(db, job.id, { includeVoid: true })]);
  return (
    <Section title="Money" id="money">
      <MoneyPanel
        jobId={job.id}
        timeZone={timeZone}
        role={user.role}
        stage={job.stage}
        words={moneyWords(money)}
        outOfDate={money.invoice && invoiceOutOfDate(money) ? outOfDateWords(money.invoice, money.priceCents) : null}
        checksOn={money.checksOn}
        owed={{ deposit: amountOwed(money, "deposit"), invoice: amountOwed(money, "invoice") }}
        payments={payments}
        invoices={invoices}
      />
    </Section>
  );
}
