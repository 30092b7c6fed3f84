"use client";

import { useRouter } from "next/navigation";
import { useEffect, useId, useRef, useState } from "react";
import { ApiRequestError } from "@/components/api";
import { buttonClass, Field, FormActions, FormAlert, inputClass, num, str, useApiForm } from "@/components/form";
import { IconCheck, IconStop, IconWarn } from "@/components/icons";
import { type MoveRefusal, refusalOf, sendMove } from "@/components/move-job";
import { RefusalNote } from "@/components/refusal-note";
import type { JobScope, Stage } from "@/db/schema";
import type { PartShape } from "@/db/tables/records";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { fieldErrorSummary } from "@/server/records/form-errors";
import {
  DROP_PRECISION_NOTE,
  type LeakTestResult,
  type LeakTestWarning,
  PRESSURE_ROSE_MESSAGE,
  SEA_LEVEL_PSIA,
  dropAgainstAllowance,
  formatDropPsi,
  pneumaticTestCautions,
  usesPressureDecay,
} from "@/server/records/leak-test";
import { type LeakTestProcedure, type ProcedureBreach, bandSource, flatWalled, gaugeSource, holdSource, pressureBand, procedureBreaches } from "@/server/records/procedure";
import type { LeakTestMethod } from "@/server/records/schemas";
import { canSendBackToFabricate, sendBackNote } from "@/server/records/send-back";
import { useFocusFirstInvalid } from "./records-form-errors";

export interface LeakTestJob {
  id: number;
  stage: Stage;
  version: number;
  workOrder: string;
  scope: JobScope;
}

export interface LeakTestPart {
  id: number;
  name: string;
  kind: string;
  shape: PartShape;
}

interface LeakTestAnswer {
  /** Null for a soap-only test recorded without hold readings. */
  correctedDropPsi: number | null;
  result: LeakTestResult;
  warnings: LeakTestWarning[];
  invalidReasons: LeakTestWarning[];
  thermometerPsiPerF?: number | null;
  thermometerCaution?: string | null;
  test: {
    partName: string;
    rawDropPsi: number | null;
    allowedDropPsi: number;
    holdMinutes: number;
    gaugeFullScalePsi: number;
    gaugeCalibratedOn: string;
    seams: { location: string; result: "pass" | "leak" }[];
  };
  /** The job as it stood when the test was saved; the page's copy may be older. */
  job: { id: number; stage: Stage; version: number; scope: JobScope };
}

type SeamRow = { key: number; location: string; result: "" | "pass" | "leak" };

const METHODS: { value: LeakTestMethod; label: string; hint: string }[] = [
  { value: "both", label: "Soap and pressure decay", hint: "Bubbles on every seam, and the gauge over the hold." },
  { value: "soap", label: "Soap solution only", hint: "Bubbles on every seam." },
  { value: "decay", label: "Pressure decay only", hint: "The gauge over the hold." },
];

// Where a fabricated reservoir usually leaks, offered as rows to check; each still needs its own pass or leak.
const RESERVOIR_SEAMS = ["Sump to shell", "Fill neck", "Suction port", "Return port", "End caps"];

const fmt = (psi: number, digits = 3) => Number(psi.toFixed(digits)).toString();

/** The corrected drop in words: a rise is said as a rise, never as a negative drop. */
export function correctedDropText(correctedDropPsi: number) {
  const shown = formatDropPsi(correctedDropPsi);
  return shown.startsWith("-") ? `pressure rose ${shown.slice(1)} psi after temperature correction` : `corrected drop ${shown} psi`;
}

/** Warnings as recorded, with the pressure-rise caution first; tests saved before that check get it derived. */
export function cautionsOf(correctedDropPsi: number | null, warnings: LeakTestWarning[]): LeakTestWarning[] {
  const rose = correctedDropPsi !== null && formatDropPsi(correctedDropPsi).startsWith("-");
  const list = rose && !warnings.some((w) => w.code === "pressure_rose_after_correction")
    ? [{ code: "pressure_rose_after_correction" as const, message: PRESSURE_ROSE_MESSAGE }, ...warnings]
    : warnings;
  return [...list].sort((a, b) => Number(b.code === "pressure_rose_after_correction") - Number(a.code === "pressure_rose_after_correction"));
}

// The form's fields in screen order, for the summary beside the submit button.
const FIELD_ORDER = [
  "method", "testPressurePsig", "holdMinutes", "gaugeFullScalePsi", "gaugeCalibratedOn", "startPressurePsig", "endPressurePsig",
  "startTempF", "endTempF", "barometricPsia", "seams", "tester",
] as const;
const FIELD_NAMES: Record<(typeof FIELD_ORDER)[number], string> = {
  method: "Method",
  testPressurePsig: "Test pressure",
  holdMinutes: "Hold",
  gaugeFullScalePsi: "Gauge full scale",
  gaugeCalibratedOn: "Gauge calibration date",
  startPressurePsig: "Start pressure",
  endPressurePsig: "End pressure",
  startTempF: "Start temperature",
  endTempF: "End temperature",
  barometricPsia: "Barometric pressure",
  seams: "Soap check",
  tester: "Tester",
};

function bandHint(shape: PartShape, procedure: LeakTestProcedure) {
  const band = pressureBand(procedure, shape);
  if (band && shape !== "other") return `For ${band.tank}: ${band.min}–${band.max} psig (${bandSource(procedure, shape)}).`;
  return "No set band for this shape: use the lowest pressure that finds a leak.";
}

/** The gauge a new form starts with: the last one used, unless that test showed it wrong for the work. */
export function gaugePrefill(test: { gaugeFullScalePsi: number; gaugeCalibratedOn: string; warnings: LeakTestWarning[]; invalidReasons?: LeakTestWarning[] } | undefined) {
  if (!test) return null;
  const flagged = new Set([...test.warnings, ...(test.invalidReasons ?? [])].map((w) => w.code));
  return {
    fullScalePsi: flagged.has("gauge_range") ? null : test.gaugeFullScalePsi,
    calibratedOn: flagged.has("gauge_calibration_old") || flagged.has("gauge_calibration_future") ? null : test.gaugeCalibratedOn,
  };
}

const numberOrUndefined = (text: string) => {
  const t = text.trim();
  if (t === "") return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : undefined;
};

/** What the leak-test form needs from the job page: the part, the shop's figures and the last gauge used. */
interface LeakTestFormProps {
  job: LeakTestJob;
  part: LeakTestPart;
  allowedDropPsi: number;
  procedure: LeakTestProcedure;
  today: string;
  tester: string;
  lastGauge: { fullScalePsi: number | null; calibratedOn: string | null } | null;
  onClose: () => void;
}

export function LeakTestForm({
  job,
  part,
  allowedDropPsi,
  procedure,
  today,
  tester,
  lastGauge,
  onClose,
}: LeakTestFormProps) {
  // Each retest is a fresh form; the gauge it starts with comes from the test just saved, unless
  // that test showed the gauge wrong for the work.
  const [round, setRound] = useState(0);
  const [gauge, setGauge] = useState(lastGauge);
  return (
    <LeakTestRound
      key={round}
      {...{ job, part, allowedDropPsi, procedure, today, tester, onClose }}
      lastGauge={gauge}
      focusOnOpen={true}
      onRetest={(answer) => {
        setGauge(gaugePrefill({ ...answer.test, warnings: answer.warnings, invalidReasons: answer.invalidReasons }));
        setRound((n) => n + 1);
      }}
    />
  );
}

function LeakTestRound({
  job,
  part,
  allowedDropPsi,
  procedure,
  today,
  tester,
  lastGauge,
  focusOnOpen,
  onRetest,
  onClose,
}: LeakTestFormProps & {
  focusOnOpen: boolean;
  onRetest: (answer: LeakTestAnswer) => void;
}) {
  const router = useRouter();
  const formId = useId();
  const [method, setMethod] = useState<LeakTestMethod>(flatWalled(part.shape) ? "soap" : "both");
  const [testPressure, setTestPressure] = useState("");
  const [hold, setHold] = useState("");
  const [gaugeScale, setGaugeScale] = useState(lastGauge?.fullScalePsi != null ? String(lastGauge.fullScalePsi) : "");
  const [calibratedOn, setCalibratedOn] = useState(lastGauge?.calibratedOn ?? "");
  const [seams, setSeams] = useState<SeamRow[]>(() =>
    (part.kind === "reservoir" ? RESERVOIR_SEAMS : [""]).map((location, key) => ({ key, location, result: "" as const })),
  );
  const [answer, setAnswer] = useState<LeakTestAnswer | null>(null);
  // Which seam row each sent seam came from, so the server's "seams.2.result" lands beside the right row.
  const [sentRows, setSentRows] = useState<number[]>([]);

  const usesSoap = method !== "decay";
  const form = useApiForm<LeakTestAnswer>(
    (v) => {
      const rows = seams.filter((s) => s.location.trim() !== "" || s.result !== "");
      const sent = usesSoap ? rows : rows.filter((s) => s.result !== "");
      setSentRows(sent.map((s) => s.key));
      return {
        path: `/api/parts/${part.id}/leak-tests`,
        body: {
          jobId: job.id,
          method,
          testPressurePsig: num(v.testPressurePsig),
          gaugeFullScalePsi: num(v.gaugeFullScalePsi),
          gaugeCalibratedOn: str(v.gaugeCalibratedOn),
          holdMinutes: num(v.holdMinutes),
          startPressurePsig: num(v.startPressurePsig),
          endPressurePsig: num(v.endPressurePsig),
          startTempF: num(v.startTempF),
          endTempF: num(v.endTempF),
          barometricPsia: num(v.barometricPsia),
          seams: sent.map((s) => ({ location: s.location, result: s.result === "" ? undefined : s.result })),
          tester: str(v.tester),
        },
      };
    },
    (result) => {
      setAnswer(result);
      router.refresh();
    },
  );

  const formRef = useRef<HTMLFormElement>(null);
  const summaryRef = useRef<HTMLParagraphElement>(null);
  useFocusFirstInvalid(formRef, form.failure, summaryRef);
  const summaryId = `${formId}-summary`;

  const seamErrors = (key: number, field: "location" | "result") => {
    const index = sentRows.indexOf(key);
    return index < 0 ? undefined : form.fields[`seams.${index}.${field}`];
  };
  const fieldLabel = (key: string): string | null => {
    const seam = /^seams\.(\d+)\.(location|result)$/.exec(key);
    if (seam) {
      const row = seams.findIndex((s) => s.key === sentRows[Number(seam[1])]);
      return row < 0 ? null : `${seam[2] === "result" ? "Result" : "Location"} of seam ${row + 1}`;
    }
    return (FIELD_NAMES as Record<string, string>)[key] ?? null;
  };
  const summary = form.failure
    ? Object.keys(form.fields).length
      ? `Not recorded. ${fieldErrorSummary(form.fields, FIELD_ORDER, fieldLabel)}`
      : form.failure.message
    : null;
  // Errors on the whole seam list land on the first seam, or on the button that adds one.
  const seamListInvalid = Boolean(form.fields.seams) && !Object.keys(form.fields).some((k) => k.startsWith("seams."));
  const pressure = Number(testPressure);
  const gaugeHint =
    testPressure !== "" && Number.isFinite(pressure) && pressure > 0
      ? `For ${fmt(pressure)} psig: a gauge of ${fmt(procedure.gaugeRatioMin * pressure)}–${fmt(procedure.gaugeRatioMax * pressure)} psi full scale, about ${fmt(2 * pressure)} (${gaugeSource(procedure)}).`
      : `About twice the test pressure; never under ${fmt(procedure.gaugeRatioMin)}× nor over ${fmt(procedure.gaugeRatioMax)}× (${gaugeSource(procedure)}).`;
  // The procedure's flags as the numbers are typed: the same rule the server decides with.
  const flags = procedureBreaches(
    { method, testPressurePsig: numberOrUndefined(testPressure), holdMinutes: numberOrUndefined(hold), gaugeFullScalePsi: numberOrUndefined(gaugeScale), gaugeCalibratedOn: calibratedOn || undefined },
    { partShape: part.shape, procedure, today },
  );
  const flagFor = (field: ProcedureBreach["field"]) => flags.find((f) => f.field === field);
  const hintOr = (field: ProcedureBreach["field"], hint: string) => {
    const flag = flagFor(field);
    return flag ? `⚠ Outside the procedure: ${flag.message}` : hint;
  };
  const flagsId = `${formId}-flags`;

  useEffect(() => {
    if (!focusOnOpen) return;
    const first = formRef.current?.querySelector<HTMLInputElement>("input:not([type=radio]), input[type=radio]:checked");
    first?.focus({ preventScroll: true });
    formRef.current?.scrollIntoView({ block: "start", behavior: "smooth" });
    // Only when the form opens.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  if (answer) return <LeakTestOutcome job={job} part={part} answer={answer} onAgain={() => onRetest(answer)} onClose={onClose} />;

  const numberInput = (p: object, extra: Record<string, unknown> = {}) => <input {...p} type="text" inputMode="decimal" autoComplete="off" className={inputClass} {...extra} />;

  return (
    <form ref={formRef} onSubmit={form.onSubmit} noValidate className="space-y-4" aria-label={`Leak test of ${part.name}`}>
      <aside aria-label="Pneumatic test cautions" className="rounded-md border-2 border-warn-700/50 bg-warn-100 p-3 text-sm text-ink">
        <p className="flex items-center gap-2 font-bold text-warn-700">
          <IconWarn /> Before you pressurize the tank
        </p>
        <ul className="mt-1 list-disc space-y-0.5 pl-5">
          {pneumaticTestCautions.map((c) => (
            <li key={c.key}>{c.text}</li>
          ))}
        </ul>
      </aside>

      <FormAlert failure={form.failure && summary ? { ...form.failure, message: summary } : null} />

      <fieldset className="space-y-2" data-field>
        <legend className="text-sm font-semibold">Method</legend>
        <div className="grid gap-2 sm:grid-cols-3">
          {METHODS.map((m) => (
            <label key={m.value} className={`flex min-h-11 cursor-pointer items-start gap-2 rounded-md border p-2 ${method === m.value ? "border-bay-700 bg-bay-50" : "border-line"}`}>
              <input type="radio" name={`${formId}-method`} value={m.value} checked={method === m.value} onChange={() => setMethod(m.value)} aria-invalid={Boolean(form.fields.method)} className="mt-1 h-5 w-5 accent-bay-700" />
              <span>
                <span className="block font-semibold">{m.label}</span>
                <span className="block text-sm text-ink-soft">{m.hint}</span>
              </span>
            </label>
          ))}
        </div>
        {form.fields.method && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.method.join(" ")}</p>}
        {flatWalled(part.shape) && method === "both" && (
          <p className="flex gap-2 text-sm font-medium text-warn-700">
            <IconWarn /> {part.shape === "d" ? "A D-shaped tank's" : "A box tank's"} flat walls flex, so pressure decay cannot be trusted on it: the soap check on every seam decides.
          </p>
        )}
        {flagFor("method") && (
          <p className="flex gap-2 text-sm font-medium text-warn-700">
            <IconWarn /> Outside the procedure: {flagFor("method")!.message}
          </p>
        )}
      </fieldset>

      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Test pressure (psig)" name="testPressurePsig" errors={form.fields.testPressurePsig} hintTone={flagFor("testPressurePsig") ? "warn" : undefined}
          hint={hintOr("testPressurePsig", bandHint(part.shape, procedure))}>
          {(p) => numberInput(p, { value: testPressure, onChange: (e: React.ChangeEvent<HTMLInputElement>) => setTestPressure(e.target.value) })}
        </Field>
        <Field
          label="Hold (minutes)"
          name="holdMinutes"
          errors={form.fields.holdMinutes}
          hintTone={flagFor("holdMinutes") ? "warn" : undefined}
          hint={hintOr("holdMinutes", `At least ${fmt(procedure.minHoldMinutes)} min before examining (${holdSource(procedure)}).`)}
        >
          {(p) => numberInput(p, { value: hold, onChange: (e: React.ChangeEvent<HTMLInputElement>) => setHold(e.target.value) })}
        </Field>
        <Field label="Gauge full scale (psi)" name="gaugeFullScalePsi" errors={form.fields.gaugeFullScalePsi} hintTone={flagFor("gaugeFullScalePsi") ? "warn" : undefined}
          hint={hintOr("gaugeFullScalePsi", gaugeHint)}>
          {(p) => numberInput(p, { value: gaugeScale, onChange: (e: React.ChangeEvent<HTMLInputElement>) => setGaugeScale(e.target.value) })}
        </Field>
        <Field
          label="Gauge last calibrated"
          name="gaugeCalibratedOn"
          errors={form.fields.gaugeCalibratedOn}
          hintTone={flagFor("gaugeCalibratedOn") ? "warn" : undefined}
          hint={hintOr("gaugeCalibratedOn", "The date on the gauge's calibration tag.")}
        >
          {(p) => <input {...p} type="date" max={today} value={calibratedOn} onChange={(e) => setCalibratedOn(e.target.value)} className={inputClass} />}
        </Field>
      </div>

      {/* The hold readings are what pressure decay decides on; a soap-only test is decided on the seams. */}
      {usesPressureDecay(method) && (
      <fieldset className="space-y-3 rounded-md border border-line p-3" data-testid="hold-readings">
        <legend className="px-1 text-sm font-semibold">Readings at the start and end of the hold</legend>
        {(
          [
            ["Gauge pressure (psig)", "pressure (psig)", "startPressurePsig", "endPressurePsig"],
            ["Temperature (°F), air or tank shell, same spot both times", "temperature (°F)", "startTempF", "endTempF"],
          ] as const
        ).map(([heading, spoken, start, end]) => (
          <div key={start}>
            <p className="text-sm font-semibold text-ink-soft">{heading}</p>
            <div className="grid grid-cols-2 gap-3">
              <Reading label="Start" spoken={spoken} name={start} errors={form.fields[start]} />
              <Reading label="End" spoken={spoken} name={end} errors={form.fields[end]} />
            </div>
          </div>
        ))}
        <Field label="Barometric pressure (psia)" name="barometricPsia" errors={form.fields.barometricPsia} hint={`${SEA_LEVEL_PSIA} psia at sea level; lower at a high-altitude shop.`}>
          {(p) => numberInput(p, { defaultValue: String(SEA_LEVEL_PSIA) })}
        </Field>
        <p className="text-sm text-ink-soft">
          The end pressure is corrected to the start temperature (ideal gas law, absolute units) and the drop compared with the shop&apos;s allowed {fmt(allowedDropPsi)} psi. {DROP_PRECISION_NOTE}
        </p>
      </fieldset>
      )}

      <fieldset className="space-y-2 rounded-md border border-line p-3">
        <legend className="px-1 text-sm font-semibold">Soap check, seam by seam{usesSoap ? "" : " (optional with pressure decay)"}</legend>
        {form.fields.seams && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.seams.join(" ")}</p>}
        <ul className="space-y-2">
          {seams.map((seam, i) => {
            const locationErrors = seamErrors(seam.key, "location");
            const resultErrors = seamErrors(seam.key, "result");
            const update = (change: Partial<SeamRow>) => setSeams((rows) => rows.map((r) => (r.key === seam.key ? { ...r, ...change } : r)));
            return (
              <li key={seam.key} data-field className={`rounded-md border p-2 ${locationErrors || resultErrors ? "border-stop-700" : "border-line"}`}>
                <div className="flex flex-wrap items-end gap-2">
                  <label className="min-w-0 flex-1 text-sm font-semibold">
                    Seam {i + 1}
                    <input value={seam.location} onChange={(e) => update({ location: e.target.value })} aria-invalid={Boolean(locationErrors) || (seamListInvalid && i === 0)} placeholder="Where on the tank" className={`${inputClass} mt-1`} />
                  </label>
                  <button
                    type="button"
                    className="grid h-11 w-11 place-items-center rounded-md border border-line text-xl text-ink-soft hover:bg-bay-50"
                    onClick={() => setSeams((rows) => rows.filter((r) => r.key !== seam.key))}
                    aria-label={`Remove seam ${i + 1}`}
                    title="Remove this seam"
                  >
                    <span aria-hidden="true">×</span>
                  </button>
                </div>
                <div className="mt-2">
                  <div role="radiogroup" aria-label={`Seam ${i + 1} result`} className="grid grid-cols-2 gap-2 sm:flex">
                    {(["pass", "leak"] as const).map((r) => (
                      <label key={r} className={`flex min-h-11 min-w-20 cursor-pointer items-center justify-center gap-1 rounded-md border px-2 font-semibold has-[:focus-visible]:ring-2 has-[:focus-visible]:ring-bay-600 ${seam.result === r ? (r === "pass" ? "border-ok-700 bg-ok-100 text-ok-700" : "border-stop-700 bg-stop-100 text-stop-700") : "border-line"}`}>
                        <input type="radio" name={`${formId}-seam-${seam.key}`} checked={seam.result === r} onChange={() => update({ result: r })} aria-invalid={Boolean(resultErrors)} className="sr-only" />
                        {r === "pass" ? <IconCheck /> : <IconStop />} {r === "pass" ? "No bubbles" : "Leak"}
                      </label>
                    ))}
                  </div>
                </div>
                {(locationErrors || resultErrors) && <p className="mt-1 text-sm font-medium text-stop-700">⚠ {[...(locationErrors ?? []), ...(resultErrors ?? [])].join(" ")}</p>}
              </li>
            );
          })}
        </ul>
        <button
          type="button"
          className={buttonClass.secondary}
          data-invalid={seamListInvalid && seams.length === 0}
          onClick={() => setSeams((rows) => [...rows, { key: Math.max(-1, ...rows.map((r) => r.key)) + 1, location: "", result: "" }])}
        >
          + Add a seam
        </button>
      </fieldset>

      <Field label="Tester" name="tester" errors={form.fields.tester}>{(p) => <input {...p} defaultValue={tester} autoComplete="name" className={inputClass} />}</Field>

      {summary && (
        <p ref={summaryRef} id={summaryId} tabIndex={-1} className="flex gap-2 rounded-md border border-stop-700/40 bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          <IconStop className="mt-0.5 h-4 w-4 shrink-0" />
          <span>{summary}</span>
        </p>
      )}
      <div id={flagsId} aria-live="polite">
        {flags.length > 0 && (
          <div className="rounded-md border-2 border-warn-700/50 bg-warn-100 p-3 text-sm text-ink" data-testid="procedure-flags">
            <p className="flex items-center gap-2 font-bold text-warn-700">
              <IconWarn /> Outside the shop&apos;s procedure: this test will be saved as invalid
            </p>
            <ul className="mt-1 list-disc space-y-0.5 pl-5">
              {flags.map((f) => (
                <li key={f.code}>{f.message}</li>
              ))}
            </ul>
            <p className="mt-1">An invalid test is neither a pass nor a fail: fix what is listed and test again.</p>
          </div>
        )}
      </div>
      <FormActions
        pending={form.pending}
        label={flags.length > 0 ? "Record as invalid" : "Record the test"}
        pendingLabel="Recording…"
        onCancel={onClose}
        describedBy={[summary ? summaryId : "", flags.length > 0 ? flagsId : ""].filter(Boolean).join(" ") || undefined}
      />
    </form>
  );
}

/** A start or end reading: a short visible label, the full name for screen readers. */
function Reading({ label, spoken, name, errors }: { label: string; spoken: string; name: string; errors?: string[] }) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-semibold">
        {label}
        <span className="sr-only"> {spoken}</span>
      </label>
      <input id={id} name={name} type="text" inputMode="decimal" autoComplete="off" aria-invalid={Boolean(errors?.length)} aria-describedby={`${id}-msg`} className={inputClass} />
      <p id={`${id}-msg`} aria-live="polite" className="text-sm font-medium text-stop-700">
        {errors?.length ? `⚠ ${errors.join(" ")}` : ""}
      </p>
    </div>
  );
}

/**
 * The offer to send a job back to Fabricate after a failed leak test. It acts on the freshest copy
 * of the job it has (the page's, or the one the test answered with), and when someone moved or
 * changed the card in between it takes the job as it now stands and asks again.
 */
export function SendBackOffer({ job, seen, note }: { job: LeakTestJob; seen?: { stage: Stage; version: number } | null; note: string }) {
  const router = useRouter();
  const [latest, setLatest] = useState<{ stage: Stage; version: number } | null>(null);
  const [moved, setMoved] = useState(false);
  const [refusal, setRefusal] = useState<MoveRefusal | null>(null);
  const [pending, setPending] = useState(false);
  const current = [job, seen, latest].reduce<{ stage: Stage; version: number }>((a, b) => (b && b.version > a.version ? b : a), job);

  if (moved) return <p className="font-semibold text-ink">✓ {job.workOrder} is back in Fabricate.</p>;
  if (!canSendBackToFabricate({ stage: current.stage, scope: job.scope })) return null;

  async function sendBack() {
    setPending(true);
    setRefusal(null);
    try {
      await sendMove(job.id, { toStage: "fabricate", version: current.version, note });
      setMoved(true);
    } catch (err) {
      const r = refusalOf(err, "fabricate");
      const now = err instanceof ApiRequestError ? (err.failure.details?.job as { stage: Stage; version: number } | undefined) : undefined;
      if (r.kind === "stale" && now) {
        setLatest({ stage: now.stage, version: now.version });
        setRefusal({ ...r, message: `${r.message} It is now in ${STAGE_LABELS[now.stage]}.` });
      } else setRefusal(r);
    } finally {
      setPending(false);
      router.refresh();
    }
  }

  return (
    <div className="space-y-2">
      <button type="button" className={`${buttonClass.danger} w-full sm:w-auto`} disabled={pending} onClick={sendBack}>
        {pending ? "Moving…" : `Send ${job.workOrder} back to Fabricate`}
      </button>
      {refusal && <RefusalNote refusal={refusal} />}
    </div>
  );
}

function LeakTestOutcome({ job, part, answer, onAgain, onClose }: { job: LeakTestJob; part: LeakTestPart; answer: LeakTestAnswer; onAgain: () => void; onClose: () => void }) {
  const pass = answer.result === "pass";
  const invalid = answer.result === "invalid";
  const leaks = answer.test.seams.filter((s) => s.result === "leak").map((s) => s.location);
  const raw = answer.test.rawDropPsi;
  const reasonCodes = new Set(answer.invalidReasons.map((r) => r.code));
  const cautions = cautionsOf(answer.correctedDropPsi, answer.warnings).filter((w) => !reasonCodes.has(w.code));
  const corrected = answer.correctedDropPsi;
  const drop = corrected === null ? null : correctedDropText(corrected);
  // A rise is no drop to weigh against the allowance; the caution below says what to check.
  const rose = corrected !== null && formatDropPsi(corrected).startsWith("-");
  const tone = pass ? "ok" : invalid ? "warn" : "stop";
  const box = { ok: "border-ok-700 bg-ok-100", warn: "border-warn-700 bg-warn-100", stop: "border-stop-700 bg-stop-100" }[tone];
  const text = { ok: "text-ok-700", warn: "text-warn-700", stop: "text-stop-700" }[tone];
  const resultRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    resultRef.current?.focus({ preventScroll: true });
    resultRef.current?.scrollIntoView({ block: "center", behavior: "smooth" });
  }, []);

  return (
    <div ref={resultRef} tabIndex={-1} role="status" aria-live="polite" data-testid="leak-test-result" className={`space-y-2 rounded-md border-2 p-3 outline-none focus-visible:ring-2 focus-visible:ring-bay-600 ${box}`}>
      <p className={`flex items-center gap-2 text-xl font-bold ${text}`}>
        {pass ? <IconCheck className="h-6 w-6" /> : invalid ? <IconWarn className="h-6 w-6" /> : <IconStop className="h-6 w-6" />}
        {pass ? "Pass" : invalid ? "Invalid" : "Fail"} — {part.name}
      </p>
      {invalid && (
        <div className="space-y-1">
          <p className="font-semibold text-ink">The test did not follow the shop&apos;s procedure, so it proves nothing either way and the part is not released for coating:</p>
          <ul className="list-disc space-y-0.5 pl-5 text-sm text-ink">
            {answer.invalidReasons.map((r) => (
              <li key={r.code}>{r.message}</li>
            ))}
          </ul>
        </div>
      )}
      {drop === null || raw === null || corrected === null ? (
        <p className="text-ink">
          <strong>Soap check</strong> after a {fmt(answer.test.holdMinutes, 1)} min hold: decided on the seams, with no hold readings to read a drop from.
        </p>
      ) : (
        <>
          <p className="text-ink">
            <strong>{drop.charAt(0).toUpperCase() + drop.slice(1)}</strong> over {fmt(answer.test.holdMinutes, 1)} min
            {rose ? "." : `, ${dropAgainstAllowance(corrected, answer.test.allowedDropPsi)}.`}{" "}
            {formatDropPsi(Math.abs(raw)) === "0.00" ? "The gauge itself did not move." : `Before the correction the gauge ${raw < 0 ? "rose" : "fell"} ${formatDropPsi(Math.abs(raw))} psi.`}
          </p>
          <p className="text-sm text-ink-soft">{DROP_PRECISION_NOTE}</p>
        </>
      )}
      {answer.thermometerCaution ? (
        <p data-testid="thermometer-caution" className="flex gap-2 rounded bg-warn-100 px-2 py-1 text-sm text-warn-700">
          <IconWarn className="mt-0.5 h-4 w-4 shrink-0" /> <span>{answer.thermometerCaution}</span>
        </p>
      ) : (
        answer.thermometerPsiPerF != null && (
          <p className="text-sm text-ink-soft">1 °F of thermometer error moves the corrected drop by {answer.thermometerPsiPerF.toFixed(3)} psi at this pressure.</p>
        )
      )}
      {leaks.length > 0 && <p className="font-semibold text-stop-700">Leak seen at: {leaks.join(", ")}.</p>}
      {cautions.length > 0 && (
        <ul className="space-y-1">
          {cautions.map((w) => (
            <li key={w.code} className={`flex gap-2 rounded bg-warn-100 px-2 py-1 text-sm text-warn-700 ${w.code === "pressure_rose_after_correction" ? "border-2 border-warn-700/50 font-semibold" : ""}`}>
              <IconWarn className="mt-0.5 h-4 w-4 shrink-0" /> <span>{w.message}</span>
            </li>
          ))}
        </ul>
      )}
      {answer.result === "fail" && <p className="text-sm text-ink">Repair it, mark the part reworked, and record a new test: a failed tank cannot go out for coating.</p>}
      {answer.result === "fail" && (
        <SendBackOffer
          job={job}
          seen={answer.job}
          note={sendBackNote({ partName: part.name, seams: answer.test.seams, correctedDropPsi: answer.correctedDropPsi, allowedDropPsi: answer.test.allowedDropPsi })}
        />
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={invalid ? buttonClass.primary : buttonClass.secondary} onClick={onAgain}>
          {invalid ? "Test again" : "Record another test"}
        </button>
        <button type="button" className={buttonClass.secondary} onClick={onClose}>
          Close
        </button>
      </div>
    </div>
  );
}
