import { showStoredDate } from "@/server/http/calendar-date";
import Link from "next/link";
import { IconCheck, IconClock, IconStop, IconWarn } from "@/components/icons";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { type CoatingRunView, coatingCandidates, listCoatingRuns, recordsSettings, vendorRecords } from "@/server/records/queries";
import { formatShopTime } from "@/server/records/calendar";
import { glossLabels } from "@/server/records/schemas";
import { VENDOR_RECORD_WINDOW_DAYS, businessDaysBetween, shopToday } from "@/server/records/turnaround";
import { type RunMoveOffer, installOffers } from "@/server/records/run-moves";
import { InspectionForm, ReceiveForm, SendRunForm, VendorForm } from "./coating-forms";
import { RunOutcomeProvider } from "./run-moves";

export const metadata = { title: "Coating" };

const day = (iso: string) => showStoredDate(iso, "EEE d MMM");
const days = (n: number) => `${n} business ${n === 1 ? "day" : "days"}`;

function RunStatus({ run, today }: { run: CoatingRunView; today: string }) {
  if (run.inspection) {
    return (
      <span className={`inline-flex items-center gap-1.5 rounded-full px-2.5 py-0.5 text-sm font-bold ${run.inspection.adhesionOk ? "bg-ok-100 text-ok-700" : "bg-warn-100 text-warn-700"}`}>
        {run.inspection.adhesionOk ? <IconCheck /> : <IconWarn />} Back and inspected{run.inspection.adhesionOk ? "" : ": adhesion failed"}
      </span>
    );
  }
  if (run.receivedOn) {
    return (
      <span className="inline-flex items-center gap-1.5 rounded-full bg-warn-100 px-2.5 py-0.5 text-sm font-bold text-warn-700">
        <IconWarn /> Back: inspection to record
      </span>
    );
  }
  if (run.overdue) {
    return (
      <span className="inline-flex items-center gap-1.5 rounded-full bg-stop-700 px-2.5 py-0.5 text-sm font-bold text-white">
        <IconWarn /> Overdue {days(Math.max(run.businessDaysOverdue, 1))}
      </span>
    );
  }
  const left = businessDaysBetween(today, run.promisedOn);
  return (
    <span className="inline-flex items-center gap-1.5 rounded-full bg-bay-50 px-2.5 py-0.5 text-sm font-bold text-bay-900">
      <IconClock /> {run.promisedOn === today ? "Due today" : `Due in ${days(left)}`}
    </span>
  );
}

function RunCard({ run, today, timeZone, offers }: { run: CoatingRunView; today: string; timeZone: string; offers: Map<number, RunMoveOffer[]> }) {
  const dft = run.inspection?.dftReadingsMils ?? [];
  return (
    <article id={`run-${run.id}`} aria-label={`Coating run ${run.id}, ${run.vendorName}`} className={`scroll-mt-4 rounded-lg border bg-panel p-3 ${run.overdue ? "border-2 border-stop-700" : "border-line"}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-lg font-bold">
          Run {run.id} · {run.vendorName}
        </h3>
        <RunStatus run={run} today={today} />
      </div>
      <p className="text-sm text-ink-soft">
        Finish: {run.finish.colour}, {glossLabels[run.finish.gloss].toLowerCase()}
      </p>
      <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4">
        <div>
          <dt className="font-semibold text-ink-soft">Sent</dt>
          <dd>{day(run.sentOn)}</dd>
        </div>
        <div>
          <dt className="font-semibold text-ink-soft">Promised</dt>
          <dd className={run.overdue ? "font-bold text-stop-700" : undefined}>{day(run.promisedOn)}</dd>
        </div>
        <div>
          <dt className="font-semibold text-ink-soft">{run.receivedOn ? "Received" : "Out"}</dt>
          <dd>{run.receivedOn ? day(run.receivedOn) : days(run.businessDaysOut)}</dd>
        </div>
        <div>
          <dt className="font-semibold text-ink-soft">Turnaround</dt>
          <dd>{run.receivedOn ? days(run.businessDaysOut) : "still out"}</dd>
        </div>
      </dl>
      <ul className="mt-2 space-y-1">
        {run.parts.map((part) => (
          <li key={part.id} className="text-sm">
            <Link href={`/jobs/${part.jobId}`} className="font-semibold text-bay-800 underline pointer-coarse:inline-flex pointer-coarse:min-h-11 pointer-coarse:items-center">
              {part.workOrder}
            </Link>{" "}
            · {part.customerName} · unit {part.unitNumber} · <strong>{part.name}</strong> <span className="text-ink-soft">({STAGE_LABELS[part.jobStage]})</span>
          </li>
        ))}
      </ul>
      {run.inspection && (
        <p className="mt-2 text-sm">
          Inspected {formatShopTime(run.inspection.inspectedAt, timeZone, "d MMM")}
          {run.inspection.inspectedByName ? ` by ${run.inspection.inspectedByName}` : ""}: film {Math.min(...dft)}–{Math.max(...dft)} mils over {dft.length} {dft.length === 1 ? "reading" : "readings"}, adhesion{" "}
          {run.inspection.adhesionOk ? "passed" : "failed"}
          {run.inspection.defects ? `; defects: ${run.inspection.defects.replace(/[.\s]+$/, "")}` : "; no defects noted"}.
        </p>
      )}
      {!run.receivedOn && (
        <div className="mt-3 border-t border-line pt-3">
          <ReceiveForm runId={run.id} sentOn={run.sentOn} today={today} />
        </div>
      )}
      {run.receivedOn && !run.inspection && (
        <div className="mt-3 border-t border-line pt-3">
          <InspectionForm runId={run.id} offers={offers.get(run.id)} />
        </div>
      )}
      {run.inspection && !run.inspection.adhesionOk && (
        <div className="mt-3 border-t border-line pt-3">
          <p className="flex items-start gap-1.5 text-sm font-semibold text-stop-700">
            <IconStop className="mt-0.5 shrink-0" /> These parts cannot go to Install: send them back for a recoat, or record a passing inspection if a recheck holds.
          </p>
          <details className="mt-1">
            <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-bay-800">Record a new inspection</summary>
            <InspectionForm runId={run.id} offers={offers.get(run.id)} />
          </details>
        </div>
      )}
    </article>
  );
}

export default async function CoatingPage() {
  const user = await requirePageStaff();
  const db = getDb();
  const now = new Date();
  const [runs, candidates, vendors, settings] = await Promise.all([
    listCoatingRuns(db, { status: "current" }, now),
    coatingCandidates(db),
    vendorRecords(db, now),
    recordsSettings(db),
  ]);
  const today = shopToday({ now, timeZone: settings.timeZone });
  const out = runs.filter((r) => !r.receivedOn);
  const overdue = out.filter((r) => r.overdue);
  const awaiting = runs.filter((r) => r.receivedOn && !r.inspection);
  const recent = runs.filter((r) => r.inspection);
  const office = user.role !== "tech";
  const waiting = candidates.filter((c) => c.lastRunId === null).length;
  const offers = await installOffers(db, runs.filter((r) => r.receivedOn && (!r.inspection || !r.inspection.adhesionOk)));

  return (
    <div className="space-y-4">
      <RunOutcomeProvider>
      <header className="space-y-1">
        <h1 className="text-2xl font-bold">Outside coating</h1>
        <p className="flex flex-wrap gap-x-4 gap-y-1" role="status">
          <span className={overdue.length ? "font-bold text-stop-700" : "text-ink-soft"}>
            {overdue.length ? <IconWarn /> : <IconCheck />} {overdue.length} overdue
          </span>
          <span>
            <IconClock /> {out.length} {out.length === 1 ? "run" : "runs"} out
          </span>
          <span className={awaiting.length ? "font-semibold text-warn-700" : "text-ink-soft"}>
            {awaiting.length} back, inspection to record
          </span>
          <span className="text-ink-soft">Today is {day(today)} (shop time); turnaround counts business days, weekends excluded.</span>
        </p>
        {office && (
          <p>
            <a href="/api/coating-runs/export.csv" download className="inline-flex min-h-11 items-center text-sm font-semibold text-bay-800 underline">
              Download CSV
            </a>{" "}
            <span className="text-sm text-ink-soft">(every coating run)</span>
          </p>
        )}
      </header>

      {/* On a phone "Send parts out" comes first (the job done most often here), the runs after it and the
          coaters' list last; on a desk the runs fill the left and the two panels stack on the right. */}
      <div className="grid grid-cols-[minmax(0,1fr)] gap-4 xl:grid-cols-[minmax(0,1fr)_420px] xl:grid-rows-[auto_1fr] xl:items-start">
        <div className="min-w-0 xl:col-start-2 xl:row-start-1">
          <Section title="Send parts out" id="send">
            {office ? (
              <SendRunForm vendors={vendors} candidates={candidates} today={today} />
            ) : (
              <p className="text-ink-soft">
                <IconStop /> The office sends coating runs. {waiting} {waiting === 1 ? "part is" : "parts are"} waiting to go out.
              </p>
            )}
          </Section>
        </div>
        <div className="min-w-0 space-y-4 xl:col-start-1 xl:row-span-2 xl:row-start-1">
          <Section title={`Out now (${out.length})`} id="out">
            {out.length === 0 ? <p className="text-ink-soft">Nothing is out at a coater.</p> : (
              <div className="space-y-3">
                {out.map((run) => (
                  <RunCard key={run.id} run={run} today={today} timeZone={settings.timeZone} offers={offers} />
                ))}
              </div>
            )}
          </Section>
          {awaiting.length > 0 && (
            <Section title={`Back: inspection to record (${awaiting.length})`} id="back">
              <div className="space-y-3">
                {awaiting.map((run) => (
                  <RunCard key={run.id} run={run} today={today} timeZone={settings.timeZone} offers={offers} />
                ))}
              </div>
            </Section>
          )}
          <Section title="Each coater's record" id="vendor-record">
            <p className="mb-2 text-sm text-ink-soft">
              Runs sent in the last {VENDOR_RECORD_WINDOW_DAYS} days. Turnaround in business days, sent to received. On time means back by the promised date; a run still out past its promise counts as late.
            </p>
            {vendors.length === 0 ? (
              <p className="text-ink-soft">No coaters yet: each one&apos;s turnaround shows here once it is on the list.</p>
            ) : (
              // Focusable and named, so a keyboard can scroll the figures sideways on a phone.
              <div tabIndex={0} role="region" aria-label="Each coater's record, table" className="overflow-x-auto">
                <table className="w-full min-w-[640px] text-left text-sm">
                  <thead>
                    <tr className="border-b border-line">
                      <th scope="col" className="py-2 pr-3">Coater</th>
                      <th scope="col" className="py-2 pr-3">Usual turnaround</th>
                      <th scope="col" className="py-2 pr-3">Runs sent</th>
                      <th scope="col" className="py-2 pr-3">Back</th>
                      <th scope="col" className="py-2 pr-3">Median turnaround</th>
                      <th scope="col" className="py-2 pr-3">On time</th>
                      <th scope="col" className="py-2">Overdue now</th>
                    </tr>
                  </thead>
                  <tbody>
                    {vendors.map((v) => {
                      const r = v.record;
                      return (
                        <tr key={v.id} className="border-b border-line">
                          <th scope="row" className="py-2 pr-3 font-semibold">{v.name}</th>
                          <td className="py-2 pr-3">{days(v.usualTurnaroundDays)}</td>
                          <td className="py-2 pr-3">{r.runs}</td>
                          <td className="py-2 pr-3">{r.received}</td>
                          <td className="py-2 pr-3">{r.medianTurnaroundBusinessDays === null ? "none back yet" : days(r.medianTurnaroundBusinessDays)}</td>
                          <td className="py-2 pr-3">{r.onTimeShare === null ? "none back or due yet" : `${Math.round(r.onTimeShare * 100)} % (${r.onTime} of ${r.onTime + r.late})`}</td>
                          <td className={`py-2 ${r.overdue ? "font-bold text-stop-700" : ""}`}>{r.overdue ? <><IconWarn /> {r.overdue}</> : "0"}</td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
              </div>
            )}
          </Section>
          {recent.length > 0 && (
            <Section title="Back in the last 30 days" id="recent">
              <div className="space-y-3">
                {recent.map((run) => (
                  <RunCard key={run.id} run={run} today={today} timeZone={settings.timeZone} offers={offers} />
                ))}
              </div>
            </Section>
          )}
        </div>

        <div className="min-w-0 xl:col-start-2 xl:row-start-2">
          <Section title="Coaters" id="vendors">
            <ul className="space-y-2">
              {vendors.map((v) => (
                <li key={v.id} className="rounded-md border border-line p-2 text-sm">
                  <p className="font-semibold">{v.name}</p>
                  <p className="text-ink-soft">
                    {v.contact || "No contact named"}
                    {v.phone && (
                      <>
                        {" · "}
                        <a href={`tel:${v.phone.replace(/[^\d+]/g, "")}`} className="underline pointer-coarse:inline-flex pointer-coarse:min-h-11 pointer-coarse:items-center">{v.phone}</a>
                      </>
                    )}
                    {v.email && (
                      <>
                        {" · "}
                        <a href={`mailto:${v.email}`} className="underline pointer-coarse:inline-flex pointer-coarse:min-h-11 pointer-coarse:items-center">{v.email}</a>
                      </>
                    )}
                    {" · "}usually {days(v.usualTurnaroundDays)}
                  </p>
                  {v.notes && <p>{v.notes}</p>}
                </li>
              ))}
            </ul>
            {vendors.length === 0 && <p className="text-ink-soft">No coaters yet. Add the coater the shop sends parts to; runs are sent to a coater on this list.</p>}
            {office && (
              // Open on a shop with no coater yet: nothing can go out for coating before one is added.
              <details className="mt-3" open={vendors.length === 0 || undefined}>
                <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-bay-800">+ Add a coater</summary>
                <VendorForm />
              </details>
            )}
          </Section>
        </div>
      </div>
      </RunOutcomeProvider>
    </div>
  );
}
