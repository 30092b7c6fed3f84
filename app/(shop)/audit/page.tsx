import Link from "next/link";
import { buttonClass, inputClass } from "@/components/styles";
import { getDb } from "@/db";
import { AUDIT_KINDS, AUDIT_KIND_LABELS } from "@/server/audit/kinds";
import { AUDIT_PAGE_SIZE, auditPeople, listAudit } from "@/server/audit/queries";
import { auditFilterSchema, filterInput } from "@/server/audit/schemas";
import { requirePageStaff } from "@/server/auth/session";
import { formatShopTime } from "@/server/records/calendar";
import { recordsSettings } from "@/server/records/queries";

export const metadata = { title: "Audit trail" };

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageStaff(["owner"]);
  const raw = filterInput(await searchParams);
  const parsed = auditFilterSchema.safeParse(raw);
  const filter = parsed.success ? parsed.data : {};
  const problems = parsed.success ? [] : parsed.error.issues.map((i) => i.message);
  const db = getDb();
  const { timeZone } = await recordsSettings(db);
  const [lines, people] = await Promise.all([listAudit(db, filter, timeZone), auditPeople(db)]);
  const query = (over: Record<string, string | undefined>) =>
    new URLSearchParams(Object.entries({ kind: filter.kind, staff: filter.staff, from: filter.from, to: filter.to, ...over }).filter(([, v]) => v) as [string, string][]).toString();
  const older = lines.length === AUDIT_PAGE_SIZE ? lines[lines.length - 1].id : null;

  return (
    <section className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold">Audit trail</h1>
        <a href={`/api/audit?${query({ format: "csv" })}`} className={buttonClass.secondary} download>
          <span aria-hidden="true">↓</span> Download CSV
        </a>
      </div>
      <p className="max-w-3xl text-ink-soft">
        Sign-ins, staff and password changes, overrides, status links, deletions and setting changes: who did it, when ({timeZone} time) and from which address (known when the app runs behind a proxy). Entries are never changed or removed.
      </p>
      <form className="grid gap-2 sm:grid-cols-2 lg:flex lg:flex-wrap lg:items-end" action="/audit">
        <label className="text-sm font-semibold">
          What
          <select name="kind" defaultValue={filter.kind ?? ""} className={`${inputClass} mt-1`}>
            <option value="">Everything</option>
            {AUDIT_KINDS.map((k) => (
              <option key={k} value={k}>
                {AUDIT_KIND_LABELS[k]}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm font-semibold">
          Who
          <select name="staff" defaultValue={filter.staff ?? ""} className={`${inputClass} mt-1`}>
            <option value="">Anyone</option>
            {people.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
                {p.active ? "" : " (deactivated)"}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm font-semibold">
          From day
          <input type="date" name="from" defaultValue={filter.from ?? ""} className={`${inputClass} mt-1`} />
        </label>
        <label className="text-sm font-semibold">
          To day
          <input type="date" name="to" defaultValue={filter.to ?? ""} className={`${inputClass} mt-1`} />
        </label>
        <div className="flex gap-2">
          <button className={buttonClass.primary}>Show</button>
          <Link href="/audit" className={buttonClass.secondary}>
            Clear
          </Link>
        </div>
      </form>
      {problems.length > 0 && (
        <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          ⚠ {problems.join(" ")} Showing everything instead.
        </p>
      )}

      <div className="rounded-lg border border-line bg-panel">
        <div className="hidden grid-cols-[11rem_12rem_11rem_8rem_1fr] gap-3 border-b border-line bg-bay-50 px-3 py-2 text-sm font-semibold text-bay-900 lg:grid" aria-hidden="true">
          <span>When</span>
          <span>What</span>
          <span>Who</span>
          <span>Address</span>
          <span>Details</span>
        </div>
        {lines.length === 0 ? (
          <p className="p-4 text-center text-ink-soft">Nothing recorded{Object.keys(raw).length ? " that matches. Clear the filters to see everything." : " yet."}</p>
        ) : (
          <ol className="divide-y divide-line" data-testid="audit-lines">
            {lines.map((l) => (
              <li key={l.id} className="grid gap-1 px-3 py-2 text-sm lg:grid-cols-[11rem_12rem_11rem_8rem_1fr] lg:gap-3">
                <time dateTime={l.at} className="text-ink-soft">
                  {formatShopTime(l.at, timeZone, "d MMM yyyy, HH:mm:ss")}
                </time>
                <span className="font-semibold">{AUDIT_KIND_LABELS[l.kind]}</span>
                {l.actorName ? (
                  <span>
                    <span className="text-ink-soft lg:hidden">By </span>
                    {l.actorName}
                  </span>
                ) : (
                  <span className="hidden text-ink-soft lg:inline">—</span>
                )}
                {l.address ? (
                  <span className="break-all text-ink-soft">
                    <span className="lg:hidden">From </span>
                    {l.address}
                  </span>
                ) : (
                  <span className="hidden text-ink-soft lg:inline">—</span>
                )}
                <span className="break-words">{l.summary}</span>
              </li>
            ))}
          </ol>
        )}
      </div>
      {older && (
        <Link href={`/audit?${query({ before: String(older) })}`} className={buttonClass.secondary}>
          Older entries
        </Link>
      )}
    </section>
  );
}
