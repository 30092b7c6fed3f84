import Link from "next/link";
import { IconCheck, IconClock, IconWarn } from "@/components/icons";
import { touchLinkClass } from "@/components/styles";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { showStoredDate } from "@/server/http/calendar-date";
import { COST_ROLES } from "@/server/parts/mutations";
import { type DeskLine, loadPartsDesk } from "@/server/parts/desk";
import { BOUGHT_PART_KIND_LABELS, countOf, DESK_INLINE_LINES, firstLinesOf, supplierSummary } from "@/server/parts/rules";
import { formatCents } from "@/components/money";
import { formatShopTime } from "@/server/records/calendar";
import { OrderGroup, type OrderLine, ReceiveButton } from "./parts-forms";

export const metadata = { title: "Parts desk" };

const day = (iso: string) => showStoredDate(iso, "EEE d MMM");

function JobCell({ line }: { line: Pick<DeskLine, "jobId" | "workOrder" | "unitNumber"> }) {
  return (
    <span className="whitespace-nowrap">
      <Link href={`/jobs/${line.jobId}#bought-parts`} className={`font-semibold underline ${touchLinkClass}`}>{line.workOrder}</Link>
      <span className="text-ink-soft"> · {line.unitNumber}</span>
    </span>
  );
}

/** Only what the order form shows goes to the browser. */
const ordering = (l: DeskLine): OrderLine => ({ id: l.id, jobId: l.jobId, workOrder: l.workOrder, unitNumber: l.unitNumber, kind: l.kind, description: l.description, partNumber: l.partNumber, quantity: l.quantity, costCents: l.costCents, lineCents: l.lineCents });

/** Only what the receive form needs goes to the browser, not the whole line. */
const receiving = (l: DeskLine) => ({ id: l.id, description: l.description, quantity: l.quantity, receivedQuantity: l.receivedQuantity, workOrder: l.workOrder });

/** One supplier's lines on order, soonest expected first, each with its Receive button. */
function OnOrderTable({ lines }: { lines: readonly DeskLine[] }) {
  // A table at the desk; on a phone each line stacks into a card with its labels, no sideways scroll.
  const label = (text: string) => <span className="font-semibold text-ink-soft md:hidden">{text}: </span>;
  return (
    <table className="w-full text-left text-sm">
      <thead className="border-b border-line text-ink-soft max-md:sr-only">
        <tr><th className="py-1 pr-2">Expected</th><th className="pr-2">Order</th><th className="pr-2">Job</th><th className="pr-2">Part</th><th className="pr-2">Received</th><th className="pr-2"><span className="sr-only">Receive</span></th></tr>
      </thead>
      <tbody>
        {lines.map((l) => (
          <tr key={l.id} className="border-b border-line/60 align-middle max-md:block max-md:py-2 md:[&>td]:py-1.5" data-on-order={l.description}>
            <td className={`pr-2 whitespace-nowrap max-md:block max-md:py-0.5 ${l.overdue ? "font-bold text-stop-700" : ""}`}>
              {l.expectedOn ? <>{l.overdue ? <IconWarn /> : <IconClock />} {l.overdue ? "Overdue · " : ""}{day(l.expectedOn)}</> : "No date given"}
            </td>
            <td className="pr-2 whitespace-nowrap max-md:block max-md:py-0.5">{label("Order")}{l.purchaseOrder ? <Link className={`underline ${touchLinkClass}`} href={`/purchase-orders/${l.purchaseOrder.id}`}>{l.purchaseOrder.number}</Link> : "—"}</td>
            <td className="pr-2 max-md:block max-md:py-0.5">{label("Job")}<JobCell line={l} /></td>
            <td className="pr-2 max-md:block max-md:py-0.5">{BOUGHT_PART_KIND_LABELS[l.kind]}: {l.quantity} × {l.description}{l.partNumber && <span className="text-ink-soft"> ({l.partNumber})</span>}</td>
            <td className="pr-2 whitespace-nowrap max-md:block max-md:py-0.5">{label("Received")}{l.receivedQuantity} of {l.quantity}</td>
            <td className="max-md:block max-md:pt-1"><ReceiveButton line={receiving(l)} /></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** A busy section folded to one row per supplier; each opens that supplier's lines. */
function SupplierRows({ groups, anchor, kind }: { groups: { supplier: string; lines: DeskLine[] }[]; anchor: string; kind: "to-order" | "on-order" }) {
  if (groups.length === 0) return null;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm" data-supplier-rows={kind}>
        <thead className="border-b border-line text-ink-soft">
          <tr>
            <th className="py-1 pr-2">Supplier</th>
            <th className="pr-2 text-right">Lines</th>
            <th className="pr-2 text-right">Jobs</th>
            <th className="pr-2 text-right">{kind === "to-order" ? "Amount" : "Next expected"}</th>
            <th><span className="sr-only">Open</span></th>
          </tr>
        </thead>
        <tbody>
          {groups.map((g) => {
            const sum = supplierSummary(g.lines);
            const name = g.supplier || "Supplier not chosen yet";
            return (
              <tr key={g.supplier || "none"} className="border-b border-line/60">
                <td className="py-1.5 pr-2 font-semibold">{name}</td>
                <td className="pr-2 text-right tabular-nums">{sum.lines.toLocaleString("en-US")}</td>
                <td className="pr-2 text-right tabular-nums">{sum.jobs.toLocaleString("en-US")}</td>
                <td className={`pr-2 text-right tabular-nums ${sum.overdue ? "font-bold text-stop-700" : ""}`}>
                  {kind === "to-order"
                    ? <>{formatCents(sum.amountCents)}{sum.unpriced ? ` (+${sum.unpriced} not priced)` : ""}</>
                    : <>{sum.nextExpectedOn ? day(sum.nextExpectedOn) : "No date given"}{sum.overdue ? ` · ${sum.overdue} overdue` : ""}</>}
                </td>
                <td className="py-1 text-right">
                  <Link className="font-semibold underline" href={`/parts?supplier=${encodeURIComponent(g.supplier)}#${anchor}`}>
                    {kind === "to-order" ? "Open to order" : "Open to receive"}<span className="sr-only"> from {name}</span>
                  </Link>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/** The shop's parts desk: what to order, what is on order and late, what came this week. */
export default async function PartsDeskPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageStaff(COST_ROLES);
  const raw = await searchParams;
  // A busy shop has thousands of open lines: a supplier's lines open from its row (?supplier=),
  // to order them on one purchase order; overdue and received show their first few.
  const opened = typeof raw.supplier === "string" ? raw.supplier : null;
  const allOverdue = raw.overdue === "all";
  const allReceived = raw.received === "all";
  const db = getDb();
  const desk = await loadPartsDesk(db);
  const toOrderCount = desk.toOrder.reduce((n, g) => n + g.lines.length, 0);
  const onOrderCount = desk.onOrder.reduce((n, g) => n + g.lines.length, 0);
  // A section of a few lines shows them all; a busy one shows a row per supplier, and the supplier
  // opened (?supplier=) shows its lines.
  const inline = (supplier: string, sectionLines: number) => supplier === opened || sectionLines <= DESK_INLINE_LINES;
  const overdueShown = allOverdue ? desk.overdue : firstLinesOf(desk.overdue);
  const receivedShown = allReceived ? desk.receivedThisWeek : firstLinesOf(desk.receivedThisWeek);
  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-2xl font-bold">Parts desk</h1>
        <p className="text-ink-soft">Bought-in parts across the shop&apos;s jobs. A job moves to Install only when all of its parts are here.</p>
      </div>
      {opened !== null && (
        <p className="text-sm">
          Showing every line from <strong>{opened || "no supplier yet"}</strong>. <Link className="font-semibold underline" href="/parts">Back to every supplier</Link>
        </p>
      )}
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        {[
          ["To order", countOf(toOrderCount, "line"), "#to-order", toOrderCount > 0 ? "warn" : "plain"],
          ["On order", countOf(onOrderCount, "line"), "#on-order", "plain"],
          ["Overdue deliveries", countOf(desk.overdue.length, "line"), "#overdue", desk.overdue.length > 0 ? "stop" : "plain"],
          ["Received this week", countOf(desk.receivedThisWeek.length, "receipt"), "#received", "plain"],
        ].map(([label, value, href, tone]) => (
          <div key={label} className={`rounded-lg border bg-panel p-3 ${tone === "stop" ? "border-2 border-stop-700" : "border-line"}`}>
            <dt className="text-sm font-semibold text-ink-soft">{label}</dt>
            <dd className={`text-xl font-bold ${tone === "stop" ? "text-stop-700" : tone === "warn" ? "text-warn-700" : ""}`}>
              <a href={href} className="underline-offset-2 hover:underline">{value}</a>
            </dd>
          </div>
        ))}
      </dl>

      {desk.overdue.length > 0 && (
        <Section title="Overdue deliveries" id="overdue">
          <ul className="space-y-2">
            {overdueShown.map((l) => (
              <li key={l.id} className="flex flex-wrap items-center justify-between gap-2 rounded-md border-2 border-stop-700 p-2" data-overdue-line={l.description}>
                <p>
                  <span className="font-bold text-stop-700"><IconWarn /> Overdue since {day(l.expectedOn!)}</span> · {l.quantity - l.receivedQuantity} × {l.description} from {l.supplier} on{" "}
                  <Link className={`underline ${touchLinkClass}`} href={`/purchase-orders/${l.purchaseOrder!.id}`}>{l.purchaseOrder!.number}</Link> for <JobCell line={l} />
                </p>
                <ReceiveButton line={receiving(l)} />
              </li>
            ))}
          </ul>
          {overdueShown.length < desk.overdue.length && (
            <p className="mt-1 text-sm text-ink-soft">
              Showing the {overdueShown.length} longest overdue of {desk.overdue.length.toLocaleString("en-US")}.{" "}
              <Link className="font-semibold underline" href="/parts?overdue=all#overdue">Show all {desk.overdue.length.toLocaleString("en-US")}</Link>
            </p>
          )}
        </Section>
      )}

      <Section title="To order" id="to-order">
        {desk.toOrder.length === 0 ? (
          <p className="text-ink-soft"><IconCheck /> Nothing to order: every bought-in part listed on a job is ordered.</p>
        ) : (
          <div className="space-y-4">
            <p className="text-sm text-ink-soft">
              {toOrderCount > DESK_INLINE_LINES && !opened ? "Open a supplier to tick its lines" : "Tick lines for one supplier"} and order them on one purchase order; lines of several jobs can share it.
            </p>
            {desk.toOrder.map((g) =>
              inline(g.supplier, toOrderCount) ? (
                <div key={g.supplier || "none"}>
                  <OrderGroup supplier={g.supplier} lines={g.lines.map(ordering)} today={desk.today} suppliers={desk.suppliers} />
                </div>
              ) : null,
            )}
            <SupplierRows groups={desk.toOrder.filter((g) => !inline(g.supplier, toOrderCount))} anchor="to-order" kind="to-order" />
          </div>
        )}
      </Section>

      <Section title="On order" id="on-order">
        {desk.onOrder.length === 0 ? (
          <p className="text-ink-soft">Nothing on order.</p>
        ) : (
          <div className="space-y-4">
            {desk.onOrder.map((g) =>
              inline(g.supplier, onOrderCount) ? (
                <div key={g.supplier}>
                  <h3 className="font-bold">{g.supplier}</h3>
                  <OnOrderTable lines={g.lines} />
                </div>
              ) : null,
            )}
            <SupplierRows groups={desk.onOrder.filter((g) => !inline(g.supplier, onOrderCount))} anchor="on-order" kind="on-order" />
          </div>
        )}
      </Section>

      <div className="grid gap-4 lg:grid-cols-2">
        <Section title={`Received this week (since ${day(desk.weekStart)})`} id="received">
          {desk.receivedThisWeek.length === 0 ? (
            <p className="text-ink-soft">Nothing received yet this week.</p>
          ) : (
            <ul className="space-y-1 text-sm">
              {receivedShown.map((r) => (
                <li key={r.id}>
                  <span className="text-ink-soft">{formatShopTime(r.at, desk.timeZone, "EEE d MMM HH:mm")}</span> · {r.quantity} × {r.description} for{" "}
                  <Link className={`underline ${touchLinkClass}`} href={`/jobs/${r.jobId}#bought-parts`}>{r.workOrder}</Link> · {r.byName}
                </li>
              ))}
            </ul>
          )}
          {receivedShown.length < desk.receivedThisWeek.length && (
            <p className="mt-1 text-sm text-ink-soft">
              Showing the newest {receivedShown.length}. <Link className="font-semibold underline" href="/parts?received=all#received">Show all {desk.receivedThisWeek.length.toLocaleString("en-US")}</Link>
            </p>
          )}
        </Section>
        <Section title="Purchase orders" id="orders">
          {desk.orders.length === 0 ? (
            <p className="text-ink-soft">No purchase orders yet.</p>
          ) : (
            <ul className="space-y-1 text-sm">
              {desk.orders.map((o) => (
                <li key={o.id} className="flex flex-wrap justify-between gap-2">
                  <span>
                    <Link className="font-semibold underline" href={`/purchase-orders/${o.id}`}>{o.number}</Link> · {o.supplier} · ordered {day(o.orderedOn)}
                  </span>
                  <span className={o.open ? "text-warn-700" : "text-ok-700"}>{o.open ? `${o.open} of ${countOf(o.lines, "line")} still to come` : `all ${countOf(o.lines, "line")} received`}</span>
                </li>
              ))}
            </ul>
          )}
        </Section>
      </div>
    </div>
  );
}
