import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import QRCode from "qrcode";
import { fmt } from "@/components/kit-calc/format";
import { PrintButton } from "@/components/print-button";
import { getDb } from "@/db";
import { currentStaff, requirePageStaff } from "@/server/auth/session";
import { showStoredDate } from "@/server/http/calendar-date";
import { appOrigin } from "@/server/http/origin";
import { findJob } from "@/server/jobs/queries";
import { SCOPE_LABELS, STAGE_LABELS, stagesFor } from "@/server/jobs/stages";
import { latestKitSpec } from "@/server/kit-spec/queries";
import { listBoughtParts } from "@/server/parts/queries";
import { BOUGHT_PART_STATE_LABELS } from "@/server/parts/rules";
import { type PartView, findSignOff, listParts } from "@/server/records/queries";
import { glossLabels, partKindLabels, partMaterialLabels } from "@/server/records/schemas";
import { indicatorInputLabels, indicatorSourceLabels, signOffChecks } from "@/server/records/sign-off";
import { shopSettings } from "@/server/shop/queries";

export async function generateMetadata({ params }: { params: Promise<{ id: string }> }): Promise<Metadata> {
  const raw = (await params).id;
  if (!(await currentStaff()) || !/^[1-9]\d{0,9}$/.test(raw)) return { title: "Shop sheet" };
  const job = await findJob(getDb(), Number(raw));
  return { title: job ? `Shop sheet ${job.workOrder}` : "Job not found" };
}

const day = (iso: string | null | undefined) => (iso ? showStoredDate(iso, "EEE d MMM yyyy") : "—");

function leakWords(part: PartView) {
  if (!part.needsLeakTest) return "No leak test";
  if (part.leak.passedSinceRework) return "Passed";
  if (part.leak.lastResult === "fail") return "Failed: rework, test again";
  if (part.leak.lastResult === "invalid") return "Invalid: test again";
  return part.reworkCount > 0 ? "Not tested since rework" : "Not tested yet";
}

function coatingWords(part: PartView) {
  if (!part.needsCoating) return "Not coated";
  const c = part.coating;
  if (!c || !c.current) return part.coating ? "Recoat: not sent yet" : "Not sent yet";
  const finish = `${c.finish.colour}, ${glossLabels[c.finish.gloss].toLowerCase()}`;
  if (c.state === "out") return `Out at ${c.vendorName} (run ${c.runId}), promised ${day(c.promisedOn)}${c.overdue ? ", overdue" : ""} · ${finish}`;
  if (c.state === "back") return `Back ${day(c.receivedOn)} (run ${c.runId}): inspection to record · ${finish}`;
  return `${c.adhesionOk ? "Back and inspected" : "Adhesion failed: recoat"} (run ${c.runId}) · ${finish}`;
}

/** A blank box to tick with a pen, or a ticked one when the record says so. */
function Box({ ticked }: { ticked: boolean }) {
  return (
    <span aria-hidden="true" className="mt-0.5 inline-flex h-4 w-4 shrink-0 items-center justify-center border border-ink text-xs font-bold leading-none">
      {ticked ? "✓" : ""}
    </span>
  );
}

/**
 * The shop sheet that rides with the truck: one or two Letter pages with what the crew builds to
 * and the blanks they tick, and a QR code that opens the job's page on a staff phone.
 */
export default async function ShopSheetPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageStaff();
  const raw = (await params).id;
  if (!/^[1-9]\d{0,9}$/.test(raw)) notFound();
  const db = getDb();
  const job = await findJob(db, Number(raw));
  if (!job) notFound();
  const [truck, customer, parts, bought, spec, signOff, shop] = await Promise.all([
    db.selectFrom("truck").select(["make", "model", "pto_opening"]).where("id", "=", job.truckId).executeTakeFirstOrThrow(),
    db.selectFrom("customer").select(["phone", "email"]).where("id", "=", job.customerId).executeTakeFirstOrThrow(),
    listParts(db, { jobId: job.id }),
    listBoughtParts(db, job.id, { withCost: false }),
    latestKitSpec(db, job.id),
    findSignOff(db, job.id),
    shopSettings(db),
  ]);
  const jobUrl = `${appOrigin()}/jobs/${job.id}`;
  // Drawn on the server as SVG: prints sharp at any size and needs no script on the page.
  // Drawn as SVG on the server and shown as an image, so no markup is injected into the page.
  const qr = `data:image/svg+xml;base64,${Buffer.from(await QRCode.toString(jobUrl, { type: "svg", errorCorrectionLevel: "M", margin: 0 })).toString("base64")}`;
  const route = stagesFor(job.scope).filter((s) => s !== "delivered");
  const checks = signOff?.fields.checks ?? {};
  const truckWords = [job.truckYear, truck.make, truck.model, job.truckDescription].filter(Boolean).join(" ");

  return (
    <article className="shop-sheet mx-auto max-w-[8.5in] space-y-3 bg-panel p-4 text-sm text-ink print:max-w-none print:space-y-2 print:p-0 print:text-[10pt]" aria-label={`Shop sheet for work order ${job.workOrder}`}>
      <div className="no-print flex flex-wrap items-center justify-between gap-2">
        <Link href={`/jobs/${job.id}`} className="inline-flex min-h-11 items-center font-semibold text-bay-800 underline">
          ← Back to {job.workOrder}
        </Link>
        <PrintButton label="Print" />
      </div>

      <header className="flex items-start justify-between gap-4 border-b-2 border-ink pb-2">
        <div className="min-w-0">
          <p className="text-xs uppercase tracking-wide text-ink-soft">{shop.name} · shop sheet</p>
          <h1 className="text-2xl font-bold leading-tight">Work order {job.workOrder}</h1>
          <p className="font-semibold">{job.description}</p>
          <p>
            {SCOPE_LABELS[job.scope]} · now in <strong>{STAGE_LABELS[job.stage]}</strong> · due {day(job.dueOn)}
            {job.priority === "rush" ? " · ▲ RUSH" : ""} · assigned to {job.techName ?? "nobody yet"}
          </p>
          <p className="text-xs text-ink-soft">Stages: {route.map((s) => STAGE_LABELS[s]).join(" → ")}</p>
        </div>
        <figure className="shrink-0 text-center">
          <img className="h-24 w-24" src={qr} alt={`QR code of the job's page, ${jobUrl}`} />
          <figcaption className="mt-1 max-w-24 text-[9px] leading-tight break-all text-ink-soft">{jobUrl}</figcaption>
        </figure>
      </header>

      <section className="grid gap-4 sm:grid-cols-2 print:grid-cols-2 print:break-inside-avoid" aria-label="Customer and truck">
        <div>
          <h2 className="font-bold uppercase tracking-wide">Customer</h2>
          <p className="font-semibold">{job.customerName}</p>
          <p>{[customer.phone, customer.email].filter(Boolean).join(" · ") || "No phone or e-mail on file"}</p>
        </div>
        <div>
          <h2 className="font-bold uppercase tracking-wide">Truck</h2>
          <dl className="grid grid-cols-[auto_1fr] gap-x-3">
            <dt className="font-semibold">Unit</dt>
            <dd>{job.unitNumber}</dd>
            <dt className="font-semibold">VIN</dt>
            <dd className="font-mono tracking-wide">{job.vin}</dd>
            <dt className="font-semibold">Truck</dt>
            <dd>{truckWords || "—"}</dd>
            <dt className="font-semibold">Transmission</dt>
            <dd>{job.transmission || "—"}</dd>
            <dt className="font-semibold">PTO opening</dt>
            <dd>{truck.pto_opening || "—"}</dd>
          </dl>
        </div>
      </section>

      {job.notes && (
        <section className="print:break-inside-avoid" aria-label="Notes">
          <h2 className="font-bold uppercase tracking-wide">Notes</h2>
          <p className="whitespace-pre-line">{job.notes}</p>
        </section>
      )}

      <section className="print:break-inside-avoid" aria-labelledby="sheet-spec">
        <h2 id="sheet-spec" className="font-bold uppercase tracking-wide">Kit spec</h2>
        {spec ? (
          <dl className="grid grid-cols-[auto_1fr] gap-x-3">
            <dt className="font-semibold">Drive</dt>
            <dd>
              Engine {fmt(spec.inputs.engineRpm, 0)} rpm at work × PTO {fmt(spec.inputs.ptoRatioPercent, 0)} % → pump {fmt(spec.results.pumpShaftRpm, 0)} rpm, {fmt(spec.inputs.pumpDisplacementCuIn, 2)} in³/rev, {fmt(spec.results.flowGpm, 1)} gpm; PTO torque {fmt(spec.results.pumpTorqueLbFt, 0)} lb·ft
            </dd>
            <dt className="font-semibold">Pressure</dt>
            <dd>
              Working {fmt(spec.inputs.workingPressurePsi, 0)} psi{spec.inputs.reliefPressurePsi !== undefined ? ` · relief ${fmt(spec.inputs.reliefPressurePsi, 0)} psi` : " · relief not given"}
            </dd>
            <dt className="font-semibold">Reservoir</dt>
            <dd>
              {fmt(spec.results.tank.totalGal, 1)} gal total, {fmt(spec.results.tank.oilGal, 1)} gal oil ({fmt(spec.results.reservoirMinutesOfFlow, 2)} min of flow)
            </dd>
            <dt className="font-semibold">Lines</dt>
            <dd>
              Suction {fmt(spec.inputs.suctionLine.insideDiameterIn, 2)} in ID × {fmt(spec.inputs.suctionLine.lengthFt, 1)} ft · return {fmt(spec.inputs.returnLine.insideDiameterIn, 2)} in ID × {fmt(spec.inputs.returnLine.lengthFt, 1)} ft
            </dd>
          </dl>
        ) : (
          <p>No kit spec saved: build to the work description and the office&apos;s notes.</p>
        )}
        {spec && <p className="text-xs text-ink-soft">Version {spec.version}, saved by {spec.savedBy.name} {day(spec.savedAt)}.</p>}
      </section>

      <section aria-labelledby="sheet-parts">
        <h2 id="sheet-parts" className="font-bold uppercase tracking-wide">Parts made here ({parts.length})</h2>
        {parts.length === 0 ? (
          <p>{job.scope === "install_only" ? "Install only: nothing is fabricated." : "No parts recorded yet."}</p>
        ) : (
          <table className="w-full border-collapse text-left">
            <thead>
              <tr className="border-b border-ink">
                <th scope="col" className="py-1 pr-2">Part</th>
                <th scope="col" className="py-1 pr-2">Leak test</th>
                <th scope="col" className="py-1">Coating</th>
              </tr>
            </thead>
            <tbody>
              {parts.map((p) => (
                <tr key={p.id} className="border-b border-line align-top print:break-inside-avoid">
                  <td className="py-1 pr-2">
                    <span className="font-semibold">{p.name}</span>
                    <span className="block text-xs text-ink-soft">
                      {partKindLabels[p.kind]}, {partMaterialLabels[p.material].toLowerCase()}
                      {p.reworkCount > 0 ? ` · reworked ${p.reworkCount}×` : ""}
                    </span>
                  </td>
                  <td className="py-1 pr-2">{leakWords(p)}</td>
                  <td className="py-1">{coatingWords(p)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section aria-labelledby="sheet-bought">
        <h2 id="sheet-bought" className="font-bold uppercase tracking-wide">Bought-in parts ({bought.length})</h2>
        {bought.length === 0 ? (
          <p>None listed.</p>
        ) : (
          <table className="w-full border-collapse text-left">
            <thead>
              <tr className="border-b border-ink">
                <th scope="col" className="py-1 pr-2">Qty</th>
                <th scope="col" className="py-1 pr-2">Part</th>
                <th scope="col" className="py-1">State</th>
              </tr>
            </thead>
            <tbody>
              {bought.map((b) => (
                <tr key={b.id} className="border-b border-line align-top print:break-inside-avoid">
                  <td className="py-1 pr-2">{b.quantity}</td>
                  <td className="py-1 pr-2">
                    {b.description}
                    {b.partNumber ? <span className="text-ink-soft"> · {b.partNumber}</span> : null}
                  </td>
                  <td className="py-1">
                    {BOUGHT_PART_STATE_LABELS[b.state]}
                    {b.state === "ordered" && b.expectedOn ? `, expected ${day(b.expectedOn)}` : ""}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section className="print:break-inside-avoid" aria-labelledby="sheet-sign-off">
        <h2 id="sheet-sign-off" className="font-bold uppercase tracking-wide">Wiring &amp; run-test sign-off</h2>
        <p className="text-xs">Run and engage the PTO as the PTO and transmission makers&apos; instructions say. Oil under pressure can inject through skin: never feel for a leak by hand.</p>
        <p className="mt-1">
          Indicator source: {signOff?.fields.indicatorSource ? indicatorSourceLabels[signOff.fields.indicatorSource] : "☐ Dash switch position  ☐ Engagement feedback from the PTO"}
          {" · "}input: {signOff?.fields.indicatorInput ? indicatorInputLabels[signOff.fields.indicatorInput] : "☐ Ground-active  ☐ Voltage-active"}
        </p>
        <ul className="mt-1 space-y-1">
          {signOffChecks.map((c) => (
            <li key={c.key} className="flex items-start gap-2">
              <Box ticked={checks[c.key] === true} />
              <span>
                {c.label}
                {c.key === "relief_pressure_recorded" && <> — {signOff?.fields.reliefPressurePsi != null ? `${fmt(signOff.fields.reliefPressurePsi, 0)} psi` : "______ psi"}</>}
                {c.key === "no_leaks_after_timed_run" && <> — {signOff?.fields.timedRunMinutes != null ? `${fmt(signOff.fields.timedRunMinutes, 0)} min` : "______ min"}</>}
              </span>
            </li>
          ))}
        </ul>
        <p className="mt-2">
          {signOff?.complete && signOff.signedBy
            ? `Signed off by ${signOff.signedBy}${signOff.signedAt ? ` on ${day(signOff.signedAt)}` : ""}.`
            : "Signed off by ______________________________   Date ____________"}
        </p>
      </section>

      <p className="border-t border-line pt-1 text-xs text-ink-soft">
        Printed {day(new Date().toISOString())} · {shop.name}
        {shop.phone ? ` · ${shop.phone}` : ""} · record tests and the sign-off in Baywright as well: this sheet is a copy.
      </p>
    </article>
  );
}
