import "server-only";
import type { DB } from "@/db";
import type { QuoteKind } from "@/db/tables/money";
import { recordAudit, type AuditActor } from "@/server/audit/record";
import { queueQuoteMessage } from "@/server/email/outbox";
import { ApiError } from "@/server/http/errors";
import { type Quote, getQuote } from "./quotes";
import type { QuoteCreate, QuoteLineInput, QuoteUpdate } from "./schemas";
import { depositRule, moneySettings } from "./settings";
import { MAX_CENTS, type PricedLine, depositCents, documentTotals, formatCents, lineAmountCents, toThousandths } from "./totals";

type Trx = DB;

function pricedLines(lines: readonly QuoteLineInput[]) {
  return lines.map((l) => {
    const quantityMilli = toThousandths(l.quantity)!;
    return { ...l, quantityMilli, amountCents: lineAmountCents(quantityMilli, l.unitPriceCents) };
  });
}

/** Totals with the shop's rate and deposit as they are now; a document over $10M is a typing slip. */
async function totalsFor(trx: Trx, kind: QuoteKind, lines: readonly PricedLine[]) {
  const settings = await moneySettings(trx);
  const totals = documentTotals(lines, settings.taxMillipercent);
  if (totals.totalCents > MAX_CENTS) {
    throw new ApiError("validation", `The total comes to ${formatCents(totals.totalCents)}, more than $10,000,000.00; check the quantities and prices.`, {
      fields: { lines: ["The total is more than $10,000,000.00."] },
    });
  }
  // A change order adds to a job whose deposit was already asked; it asks none of its own.
  const deposit = kind === "quote" ? depositCents(totals.totalCents, depositRule(settings)) : 0;
  return { ...totals, taxMillipercent: settings.taxMillipercent, depositCents: deposit, terms: settings.quoteTerms };
}

function totalsColumns(totals: Awaited<ReturnType<typeof totalsFor>>) {
  return {
    tax_millipercent: totals.taxMillipercent,
    subtotal_cents: totals.subtotalCents,
    taxable_cents: totals.taxableCents,
    tax_cents: totals.taxCents,
    total_cents: totals.totalCents,
    deposit_cents: totals.depositCents,
    terms: totals.terms,
  };
}

async function writeLines(trx: Trx, quoteId: number, lines: ReturnType<typeof pricedLines>) {
  await trx.deleteFrom("quote_line").where("quote_id", "=", quoteId).execute();
  await trx
    .insertInto("quote_line")
    .values(
      lines.map((l, position) => ({
        quote_id: quoteId,
        position,
        kind: l.kind,
        description: l.description,
        quantity_milli: l.quantityMilli,
        unit_price_cents: l.unitPriceCents,
        taxable: l.taxable ? 1 : 0,
        amount_cents: l.amountCents,
        price_item_id: l.priceItemId ?? null,
      })),
    )
    .execute();
}

/**
 * The draft a change is about, or the refusal that says why it cannot be changed: a sent version is
 * never changed, only replaced by a new one.
 */
async function openDraft(trx: Trx, quoteId: number, doing: "change" | "send") {
  const quote = await trx
    .selectFrom("quote")
    .innerJoin("job", "job.id", "quote.job_id")
    .select(["quote.id", "quote.job_id", "quote.kind", "quote.status", "quote.version", "quote.updated_at", "quote.supersedes_id", "job.work_order"])
    .where("quote.id", "=", quoteId)
    .executeTakeFirst();
  if (!quote) throw new ApiError("not_found", "That quote was not found. Reload the job page.");
  if (quote.status !== "draft") {
    throw new ApiError(
      "conflict",
      doing === "send"
        ? `Version ${quote.version} was already sent. Start a new version to change it.`
        : `Version ${quote.version} was sent to the customer and is never changed. Start a new version from it instead.`,
    );
  }
  return quote;
}

/**
 * A new draft version on the job. A quote is written until one is approved; after that, added work
 * is a change order. One draft of each kind at a time, so two people cannot price the same thing twice.
 * A change order may say which earlier change order it replaces (`replacesId`); a new quote version
 * always replaces the quote still waiting.
 */
export async function createQuote(db: DB, actor: AuditActor, jobId: number, input: QuoteCreate): Promise<Quote> {
  const kind = input.kind ?? "quote";
  const lines = pricedLines(input.lines);
  const id = await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "stage"]).where("id", "=", jobId).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    const existing = await trx.selectFrom("quote").select(["id", "version", "kind", "status"]).where("job_id", "=", jobId).execute();
    const approved = existing.find((q) => q.kind === "quote" && q.status === "approved");
    if (kind === "quote" && approved) {
      throw new ApiError("conflict", `Quote version ${approved.version} is approved. Add further work as a change order.`);
    }
    if (kind === "change_order" && !approved) {
      throw new ApiError("conflict", "A change order adds to an approved quote, and this job has none yet. Change the quote instead.");
    }
    const draft = existing.find((q) => q.kind === kind && q.status === "draft");
    if (draft) {
      throw new ApiError("conflict", `Draft version ${draft.version} is still open on this job. Change that draft or send it.`, { quoteId: draft.id });
    }
    let replaces: number | null = null;
    if (input.replacesId !== undefined && input.replacesId !== null) {
      const old = existing.find((q) => q.id === input.replacesId);
      if (!old || old.kind !== kind || !["sent", "declined"].includes(old.status)) {
        throw new ApiError("validation", "replacesId must be a sent or declined version of the same kind on this job.", {
          fields: { replacesId: ["Choose a sent or declined version of the same kind on this job."] },
        });
      }
      replaces = old.id;
    }
    const totals = await totalsFor(trx, kind, lines);
    const now = new Date().toISOString();
    const version = existing.reduce((max, q) => Math.max(max, q.version), 0) + 1;
    const row = await trx
      .insertInto("quote")
      .values({
        job_id: jobId,
        version,
        kind,
        status: "draft",
        supersedes_id: replaces,
        ...totalsColumns(totals),
        note: input.note ?? "",
        created_by: actor.id,
        created_at: now,
        updated_at: now,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await writeLines(trx, row.id, lines);
    return row.id;
  });
  return getQuote(db, id);
}

/** Changes a draft. A sent quote is never changed: a new version replaces it. */
export async function updateQuoteDraft(db: DB, quoteId: number, input: QuoteUpdate): Promise<Quote> {
  const lines = pricedLines(input.lines);
  await db.transaction().execute(async (trx) => {
    const quote = await openDraft(trx, quoteId, "change");
    if (input.updatedAt !== undefined && input.updatedAt !== quote.updated_at) {
      throw new ApiError("stale", `Someone saved draft version ${quote.version} after you opened it. Reload it and make your change again.`);
    }
    const totals = await totalsFor(trx, quote.kind, lines);
    await trx
      .updateTable("quote")
      .set({ ...totalsColumns(totals), ...(input.note !== undefined ? { note: input.note } : {}), updated_at: new Date().toISOString() })
      .where("id", "=", quoteId)
      .execute();
    await writeLines(trx, quoteId, lines);
  });
  return getQuote(db, quoteId);
}

/**
 * Sends a draft: its figures are worked out once more with the shop's rate, deposit and terms as
 * they are now and never change again, and its e-mail (with the PDF) is put in the outbox to go at
 * once. A new quote version replaces the quote still waiting for the customer; a change order
 * replaces only the change order it was started from, since two change orders are usually two
 * different pieces of added work.
 */
export async function sendQuote(db: DB, actor: AuditActor, quoteId: number): Promise<{ quote: Quote; outboxId: string }> {
  const outboxId = await db.transaction().execute(async (trx) => {
    const quote = await openDraft(trx, quoteId, "send");
    const rows = await trx.selectFrom("quote_line").select(["kind", "quantity_milli", "unit_price_cents", "taxable"]).where("quote_id", "=", quoteId).execute();
    if (!rows.length) throw new ApiError("validation", "A quote needs at least one line before it is sent.", { fields: { lines: ["Add at least one line."] } });
    const totals = await totalsFor(
      trx,
      quote.kind,
      rows.map((r) => ({ kind: r.kind, quantityMilli: r.quantity_milli, unitPriceCents: r.unit_price_cents, taxable: r.taxable === 1 })),
    );
    const now = new Date().toISOString();
    let supersedes = quote.supersedes_id;
    if (quote.kind === "quote") {
      const earlier = await trx
        .selectFrom("quote")
        .select("id")
        .where("job_id", "=", quote.job_id)
        .where("kind", "=", "quote")
        .where("status", "in", ["sent", "declined", "superseded"])
        .where("version", "<", quote.version)
        .orderBy("version", "desc")
        .limit(1)
        .executeTakeFirst();
      supersedes = earlier?.id ?? null;
      await trx.updateTable("quote").set({ status: "superseded", updated_at: now }).where("job_id", "=", quote.job_id).where("kind", "=", "quote").where("status", "=", "sent").execute();
    } else if (supersedes !== null) {
      await trx.updateTable("quote").set({ status: "superseded", updated_at: now }).where("id", "=", supersedes).where("status", "=", "sent").execute();
    }
    await trx
      .updateTable("quote")
      .set({ status: "sent", supersedes_id: supersedes, ...totalsColumns(totals), sent_at: now, sent_by: actor.id, updated_at: now })
      .where("id", "=", quoteId)
      .execute();
    const what = quote.kind === "quote" ? "quote" : "change order";
    await recordAudit(trx, {
      kind: "quote_sent",
      actor,
      subject: quote.work_order,
      summary: `${actor.name} sent ${what} version ${quote.version} for ${formatCents(totals.totalCents)} to the customer.`,
      details: { quoteId, version: quote.version, totalCents: totals.totalCents, depositCents: totals.depositCents, taxCents: totals.taxCents },
    });
    return queueQuoteMessage(trx, { jobId: quote.job_id, quoteId, requestedBy: actor.name, at: now });
  });
  return { quote: await getQuote(db, quoteId), outboxId };
}
