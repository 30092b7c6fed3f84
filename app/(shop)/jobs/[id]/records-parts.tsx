"use client";

import { showStoredDate } from "@/server/http/stored-date";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { buttonClass, FormActions, FormAlert, inputClass, useApiForm } from "@/components/form";
import { IconCheck, IconClock, IconStop, IconWarn } from "@/components/icons";
import type { JobScope } from "@/db/schema";
import { tankFill } from "@/server/kit-calc/tank";
import { formatShopTime } from "@/server/records/calendar";
import type { LeakTestView, PartView } from "@/server/records/queries";
import { glossLabels, partKindLabels, partMaterialLabels } from "@/server/records/labels";
import type { PartGeometry } from "@/server/records/schemas";
import { sendBackNote } from "@/server/records/send-back";
import type { LeakTestProcedure } from "@/server/records/procedure";
import { type LeakTestJob, LeakTestForm, SendBackOffer, cautionsOf, correctedDropText, gaugePrefill } from "./records-leak-test";
import { PartForm } from "./records-part-form";

type Panel = { partId: number; mode: "test" | "edit" | "rework" } | { partId: null; mode: "add" } | null;

const day = (iso: string) => showStoredDate(iso, "EEE d MMM");
const dateTime = (iso: string, timeZone: string) => formatShopTime(iso, timeZone, "d MMM yyyy, HH:mm");

// Cylinder, box or D-shaped volume (the calculator's exact geometry) in US gallons of 231 in³.
function geometryText(geometry: PartGeometry) {
  const gallons = tankFill(geometry, geometry.shape === "round" ? geometry.insideDiameterIn : geometry.heightIn).totalCuIn / 231;
  const size =
    geometry.shape === "round"
      ? `${geometry.insideDiameterIn} in inside diameter × ${geometry.lengthIn} in long`
      : `${geometry.lengthIn} × ${geometry.widthIn} × ${geometry.heightIn} in${geometry.shape === "d" ? " (length × width × height)" : ""}`;
  return `${size}, about ${gallons.toFixed(1)} gal total`;
}

function Status({ tone, icon, children }: { tone: "ok" | "warn" | "stop" | "plain"; icon: React.ReactNode; children: React.ReactNode }) {
  const tones = { ok: "text-ok-700", warn: "text-warn-700", stop: "text-stop-700", plain: "text-ink-soft" };
  return (
    <p className={`flex items-start gap-1.5 font-semibold ${tones[tone]}`}>
      <span className="mt-0.5 shrink-0">{icon}</span>
      <span>{children}</span>
    </p>
  );
}

function LeakStatus({ part }: { part: PartView }) {
  if (!part.needsLeakTest) return <Status tone="plain" icon="–">No leak test needed</Status>;
  if (part.leak.passedSinceRework) return <Status tone="ok" icon={<IconCheck />}>Leak test passed{part.reworkCount > 0 ? " since its last rework" : ""}</Status>;
  if (part.leak.lastResult === "fail") return <Status tone="stop" icon={<IconStop />}>Last leak test failed: rework it, then record a new test</Status>;
  if (part.leak.lastResult === "invalid") return <Status tone="warn" icon={<IconWarn />}>Last leak test invalid (outside the shop&apos;s procedure): test it again</Status>;
  if (part.reworkCount > 0) return <Status tone="warn" icon={<IconWarn />}>Reworked: test it again</Status>;
  return <Status tone="warn" icon={<IconClock />}>Not leak-tested yet</Status>;
}

function CoatingStatus({ part }: { part: PartView }) {
  if (!part.needsCoating) return <Status tone="plain" icon="–">No outside coating</Status>;
  const c = part.coating;
  if (!c) return <Status tone="warn" icon={<IconClock />}>Not sent for coating yet</Status>;
  const run = (
    <Link href={`/coating#run-${c.runId}`} className="underline pointer-coarse:inline-flex pointer-coarse:min-h-11 pointer-coarse:items-center">
      run {c.runId}
    </Link>
  );
  if (!c.current) return <Status tone="warn" icon={<IconWarn />}>Reworked since its coating ({run}): send it out again</Status>;
  if (c.state === "inspected" && c.adhesionOk === false) {
    return <Status tone="stop" icon={<IconStop />}>Coating failed adhesion ({run}): send it back for a recoat or record a passing inspection</Status>;
  }
  if (c.state === "out" && c.overdue) {
    return <Status tone="stop" icon={<IconWarn />}>Coating overdue: {run} at {c.vendorName} was promised {day(c.promisedOn)}</Status>;
  }
  if (c.state === "out") return <Status tone="warn" icon={<IconClock />}>Out at {c.vendorName} on {run} since {day(c.sentOn)}, promised {day(c.promisedOn)}</Status>;
  if (c.state === "back") return <Status tone="warn" icon={<IconWarn />}>Back from {c.vendorName} {day(c.receivedOn!)} ({run}): record the receiving inspection</Status>;
  return (
    <Status tone="ok" icon={<IconCheck />}>
      Coated {c.finish.colour}, {glossLabels[c.finish.gloss].toLowerCase()}: back {day(c.receivedOn!)} and inspected ({run})
    </Status>
  );
}

function ReworkForm({ part, onDone, onCancel }: { part: PartView; onDone: () => void; onCancel: () => void }) {
  const router = useRouter();
  const form = useApiForm(
    (v) => ({ path: `/api/parts/${part.id}`, method: "PATCH", body: { reworked: true, reworkNote: typeof v.reworkNote === "string" ? v.reworkNote : "" } }),
    () => {
      router.refresh();
      onDone();
    },
  );
  return (
    <form onSubmit={form.onSubmit} noValidate className="space-y-2 rounded-md border border-warn-700/50 bg-warn-100 p-3">
      <FormAlert failure={form.failure} />
      <p className="text-sm text-ink">
        <strong>Marking {part.name} reworked voids its earlier leak tests.</strong> Record a new passing test before it goes out for coating.
      </p>
      <label className="block text-sm font-semibold">
        What was reworked
        <textarea name="reworkNote" rows={2} maxLength={500} className={`${inputClass} mt-1`} placeholder="e.g. rewelded the sump seam" />
      </label>
      {form.fields.reworkNote && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.reworkNote.join(" ")}</p>}
      <FormActions pending={form.pending} label="Mark reworked" pendingLabel="Saving…" onCancel={onCancel} />
    </form>
  );
}

function TestHistory({ tests, timeZone }: { tests: LeakTestView[]; timeZone: string }) {
  if (tests.length === 0) return null;
  return (
    <details className="mt-2">
      <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-bay-800">Leak-test history ({tests.length})</summary>
      <ol className="space-y-2">
        {tests.map((t) => (
          <li key={t.id} className={`border-l-4 pl-3 text-sm ${t.result === "pass" ? "border-ok-700" : t.result === "invalid" ? "border-warn-700" : "border-stop-700"}`}>
            <p className="font-semibold">
              {t.result === "pass" ? <IconCheck /> : t.result === "invalid" ? <IconWarn /> : <IconStop />} {t.result === "pass" ? "Pass" : t.result === "invalid" ? "Invalid" : "Fail"} · {dateTime(t.testedAt, timeZone)} · {t.tester}
              {!t.current && <span className="ml-1 rounded bg-line px-1.5 text-ink-soft">before a rework: no longer counts</span>}
            </p>
            <p className="text-ink-soft">
              {t.testPressurePsig} psig held {t.holdMinutes} min ({t.method === "both" ? "soap and decay" : t.method === "soap" ? "soap" : "pressure decay"}) on a {t.gaugeFullScalePsi} psi gauge;{" "}
              {t.correctedDropPsi === null ? "decided on the seams, no hold readings" : <>{t.startPressurePsig} → {t.endPressurePsig} psig at {t.startTempF} → {t.endTempF} °F; {correctedDropText(t.correctedDropPsi)} (allowed {t.allowedDropPsi} psi)</>}
            </p>
            {t.result === "invalid" && <p className="font-semibold text-warn-700">Outside the shop&apos;s procedure, so it counts for nothing:</p>}
            {t.seams.some((s) => s.result === "leak") && <p className="text-stop-700">Leak at: {t.seams.filter((s) => s.result === "leak").map((s) => s.location).join(", ")}</p>}
            {cautionsOf(t.correctedDropPsi, t.warnings).map((w) => (
              <p key={w.code} className="text-warn-700">
                <IconWarn /> {w.message}
              </p>
            ))}
          </li>
        ))}
      </ol>
    </details>
  );
}

export function RecordsParts({
  job,
  parts,
  leakTests,
  allowedDropPsi,
  procedure,
  today,
  timeZone,
  userName,
  canEditGates,
}: {
  job: LeakTestJob & { scope: JobScope };
  parts: PartView[];
  leakTests: LeakTestView[];
  allowedDropPsi: number;
  procedure: LeakTestProcedure;
  today: string;
  timeZone: string;
  userName: string;
  /** Office and owner: may change a part's kind or take it off the leak-test or coating list. */
  canEditGates: boolean;
}) {
  const [panel, setPanel] = useState<Panel>(null);
  const close = () => setPanel(null);
  // The gauge the last test used, unless that test showed it out of range or out of calibration.
  const lastGauge = gaugePrefill(leakTests[0]);

  return (
    <div className="space-y-3">
      {job.scope === "install_only" && parts.length === 0 && (
        <p className="text-ink-soft">An install-only job has no fabricated parts: nothing here is leak-tested or sent out for coating. Change the job&apos;s Work to fabricated parts first if the shop builds parts for it.</p>
      )}
      {job.scope === "fabrication" && parts.length === 0 && (
        <p className="text-ink-soft">No parts yet. Add each tank, box and bracket the shop builds for this job: what the job needs before it can move to Outside coating and Install is read from them.</p>
      )}
      <ul className="space-y-3">
        {parts.map((part) => {
          const open = panel && panel.partId === part.id ? panel.mode : null;
          const failedTest = part.leak.lastResult === "fail" ? leakTests.find((t) => t.partId === part.id && t.current) : undefined;
          return (
            <li key={part.id} className="rounded-md border border-line p-3" data-part={part.name}>
              <h3 className="text-lg font-bold">{part.name}</h3>
              <p className="text-sm text-ink-soft">
                {partKindLabels[part.kind]} · {partMaterialLabels[part.material]}
                {part.shape !== "other" ? ` · ${part.shape === "d" ? "D-shaped" : part.shape}` : ""}
                {part.geometry ? ` · ${geometryText(part.geometry)}` : ""}
              </p>
              {part.notes && <p className="text-sm">{part.notes}</p>}
              <div className="mt-2 grid gap-1 sm:grid-cols-2">
                <LeakStatus part={part} />
                <CoatingStatus part={part} />
              </div>
              {failedTest && !open && (
                <div className="mt-2">
                  <SendBackOffer job={job} note={sendBackNote(failedTest)} />
                </div>
              )}
              {part.reworkedAt && (
                <p className="mt-1 text-sm text-ink-soft">
                  Reworked {dateTime(part.reworkedAt, timeZone)}
                  {part.reworkNote ? `: ${part.reworkNote}` : ""}
                </p>
              )}
              {!open && (
                <div className="mt-2 flex flex-wrap gap-2">
                  {part.needsLeakTest && (
                    <button type="button" className={part.leak.passedSinceRework ? buttonClass.secondary : buttonClass.primary} onClick={() => setPanel({ partId: part.id, mode: "test" })}>
                      Record a leak test
                    </button>
                  )}
                  <button type="button" className={buttonClass.secondary} onClick={() => setPanel({ partId: part.id, mode: "edit" })}>
                    Edit
                  </button>
                  <button type="button" className={buttonClass.secondary} onClick={() => setPanel({ partId: part.id, mode: "rework" })}>
                    Mark reworked
                  </button>
                </div>
              )}
              {open && (
                <div className="mt-3">
                  {open === "test" && (
                    <LeakTestForm job={job} part={part} allowedDropPsi={allowedDropPsi} procedure={procedure} today={today} tester={userName} lastGauge={lastGauge} onClose={close} />
                  )}
                  {open === "edit" && <PartForm jobId={job.id} part={part} canEditGates={canEditGates} installOnly={job.scope === "install_only"} onDone={close} onCancel={close} />}
                  {open === "rework" && <ReworkForm part={part} onDone={close} onCancel={close} />}
                </div>
              )}
              <TestHistory tests={leakTests.filter((t) => t.partId === part.id)} timeZone={timeZone} />
            </li>
          );
        })}
      </ul>
      {panel?.mode === "add" ? (
        <PartForm jobId={job.id} canEditGates={canEditGates} installOnly={job.scope === "install_only"} onDone={close} onCancel={close} />
      ) : (
        <button type="button" className={buttonClass.secondary} onClick={() => setPanel({ partId: null, mode: "add" })}>
          + Add a part
        </button>
      )}
    </div>
  );
}
