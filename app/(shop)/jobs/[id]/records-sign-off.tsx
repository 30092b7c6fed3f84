"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { FormAlert, buttonClass, inputClass, num } from "@/components/form";
import { IconCheck, IconClock, IconWarn } from "@/components/icons";
import { formatShopTime } from "@/server/records/calendar";
import type { SignOffView } from "@/server/records/queries";
import type { WiringSignOff } from "@/server/records/schemas";
import {
  INDICATOR_INPUTS,
  INDICATOR_SOURCES,
  type SignOffCheckKey,
  indicatorInputLabels,
  indicatorSourceLabels,
  signOffChecks,
  wiringCautions,
} from "@/server/records/sign-off";

type Draft = {
  indicatorSource: WiringSignOff["indicatorSource"];
  indicatorInput: WiringSignOff["indicatorInput"];
  checks: Partial<Record<SignOffCheckKey, boolean>>;
  reliefPressurePsi: string;
  timedRunMinutes: string;
  signedBy: string;
};

function draftOf(signOff: SignOffView | null): Draft {
  const f = signOff?.fields;
  return {
    indicatorSource: f?.indicatorSource ?? null,
    indicatorInput: f?.indicatorInput ?? null,
    checks: { ...(f?.checks ?? {}) },
    reliefPressurePsi: f?.reliefPressurePsi == null ? "" : String(f.reliefPressurePsi),
    timedRunMinutes: f?.timedRunMinutes == null ? "" : String(f.timedRunMinutes),
    signedBy: f?.signedBy ?? "",
  };
}

function TextField({ label, value, onChange, errors, hint, numeric }: { label: string; value: string; onChange: (value: string) => void; errors?: string[]; hint?: string; numeric?: boolean }) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-semibold">
        {label}
      </label>
      <input
        id={id}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        inputMode={numeric ? "decimal" : undefined}
        autoComplete={numeric ? "off" : "name"}
        aria-invalid={Boolean(errors?.length)}
        aria-describedby={`${id}-msg`}
        className={inputClass}
      />
      <p id={`${id}-msg`} aria-live="polite" className={errors?.length ? "text-sm font-medium text-stop-700" : "text-sm text-ink-soft"}>
        {errors?.length ? `⚠ ${errors.join(" ")}` : hint}
      </p>
    </div>
  );
}

/** The wiring & run-test sign-off: saved as a draft at any point, complete when nothing is missing. */
export function SignOffForm({ jobId, initial, timeZone }: { jobId: number; initial: SignOffView | null; timeZone: string }) {
  const router = useRouter();
  const id = useId();
  const [draft, setDraft] = useState<Draft>(() => draftOf(initial));
  const [saved, setSaved] = useState<SignOffView | null>(initial);
  // The version this form was filled from; the server refuses a save made over a newer one.
  const [version, setVersion] = useState(initial?.version ?? 0);
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [pending, setPending] = useState<"draft" | "sign" | null>(null);
  const [notice, setNotice] = useState<"draft" | "sign" | null>(null);
  const fields = failure?.fields ?? {};

  async function save(intent: "draft" | "sign") {
    setPending(intent);
    setFailure(null);
    setNotice(null);
    try {
      const body = {
        indicatorSource: draft.indicatorSource,
        indicatorInput: draft.indicatorInput,
        checks: draft.checks,
        reliefPressurePsi: num(draft.reliefPressurePsi) ?? null,
        timedRunMinutes: num(draft.timedRunMinutes) ?? null,
        signedBy: draft.signedBy.trim() || null,
        expectedVersion: version,
      };
      const result = await api<{ signOff: SignOffView }>(`/api/jobs/${jobId}/sign-off`, { method: "PUT", body });
      setSaved(result.signOff);
      setVersion(result.signOff.version);
      setNotice(intent);
      router.refresh();
    } catch (err) {
      if (!(err instanceof ApiRequestError)) throw err;
      setFailure(err.failure);
      if (err.failure.code === "stale") {
        // Someone saved first: show what is on record now, so nobody signs over a check they never saw.
        const current = (err.failure.details?.signOff as SignOffView | null | undefined) ?? null;
        setSaved(current);
        setDraft(draftOf(current));
        setVersion(current?.version ?? 0);
        router.refresh();
      }
    } finally {
      setPending(null);
    }
  }

  const error = (name: string) => (fields[name] ? <p className="text-sm font-medium text-stop-700">⚠ {fields[name].join(" ")}</p> : null);
  const radio = <T extends string>(group: "indicatorSource" | "indicatorInput", values: readonly T[], labels: Record<T, string>, legend: string) => (
    <fieldset className="space-y-1">
      <legend className="text-sm font-semibold">{legend}</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {values.map((value) => (
          <label key={value} className={`flex min-h-11 cursor-pointer items-center gap-2 rounded-md border px-3 ${draft[group] === value ? "border-bay-700 bg-bay-50" : "border-line"}`}>
            <input type="radio" name={`${id}-${group}`} checked={draft[group] === value} onChange={() => setDraft((d) => ({ ...d, [group]: value }))} className="h-5 w-5 accent-bay-700" />
            {labels[value]}
          </label>
        ))}
      </div>
      {error(group)}
    </fieldset>
  );

  return (
    <form
      noValidate
      className="space-y-4"
      aria-label="Wiring and run-test sign-off"
      onSubmit={(e) => {
        e.preventDefault();
        void save("sign");
      }}
    >
      <aside aria-label="Wiring and run-test cautions" className="rounded-md border-2 border-warn-700/50 bg-warn-100 p-3 text-sm">
        <p className="flex items-center gap-2 font-bold text-warn-700">
          <IconWarn /> Before the run test
        </p>
        <ul className="mt-1 list-disc space-y-0.5 pl-5">
          {wiringCautions.map((c) => (
            <li key={c.key}>{c.text}</li>
          ))}
        </ul>
      </aside>

      {saved?.complete ? (
        <p role="status" className="flex items-start gap-2 rounded-md border-2 border-ok-700 bg-ok-100 p-3 font-semibold text-ok-700">
          <IconCheck className="mt-0.5 h-5 w-5 shrink-0" />
          <span>
            Signed off by {saved.signedBy} on {formatShopTime(saved.signedAt!, timeZone, "d MMM yyyy, HH:mm")}
            {saved.signedByStaffName && saved.signedByStaffName !== saved.signedBy ? ` (saved by ${saved.signedByStaffName})` : ""}. Saving a change signs it again.
          </span>
        </p>
      ) : saved ? (
        <div role="status" className="rounded-md border border-warn-700/50 bg-warn-100 p-3 text-sm">
          <p className="flex items-center gap-2 font-semibold text-warn-700">
            <IconClock /> Draft saved {formatShopTime(saved.updatedAt, timeZone, "d MMM, HH:mm")}
            {saved.updatedByName ? ` by ${saved.updatedByName}` : ""}. Still to do:
          </p>
          <ul className="mt-1 list-disc pl-5 text-ink">
            {saved.missing.map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
        </div>
      ) : (
        <p className="text-ink-soft">Not started. Save a draft at any point and finish it later.</p>
      )}

      <FormAlert failure={failure} />
      {radio("indicatorSource", INDICATOR_SOURCES, indicatorSourceLabels, "What lights the PTO indicator")}
      {radio("indicatorInput", INDICATOR_INPUTS, indicatorInputLabels, "Indicator input")}

      <fieldset className="space-y-1">
        <legend className="text-sm font-semibold">Run-test checks</legend>
        <ul className="divide-y divide-line rounded-md border border-line">
          {signOffChecks.map((check) => (
            <li key={check.key} className="p-2">
              <label className="flex min-h-11 cursor-pointer items-center gap-3">
                <input
                  type="checkbox"
                  checked={draft.checks[check.key] === true}
                  onChange={(e) => setDraft((d) => ({ ...d, checks: { ...d.checks, [check.key]: e.target.checked } }))}
                  className="h-6 w-6 shrink-0 accent-bay-700"
                />
                <span>{check.label}</span>
              </label>
              {check.key === "relief_pressure_recorded" && (
                <div className="ml-9 max-w-56">
                  <TextField label="Relief pressure measured (psi)" value={draft.reliefPressurePsi} onChange={(v) => setDraft((d) => ({ ...d, reliefPressurePsi: v }))} errors={fields.reliefPressurePsi} numeric />
                </div>
              )}
              {check.key === "no_leaks_after_timed_run" && (
                <div className="ml-9 max-w-56">
                  <TextField label="Timed run (minutes)" value={draft.timedRunMinutes} onChange={(v) => setDraft((d) => ({ ...d, timedRunMinutes: v }))} errors={fields.timedRunMinutes} numeric />
                </div>
              )}
              {error(`checks.${check.key}`)}
            </li>
          ))}
        </ul>
      </fieldset>

      <TextField
        label="Signed by"
        value={draft.signedBy}
        onChange={(v) => setDraft((d) => ({ ...d, signedBy: v }))}
        errors={fields.signedBy}
        hint="The person who did the run test types their name. The sign-off is complete when everything above is done."
      />

      <div className="flex flex-wrap gap-2">
        <button type="button" className={buttonClass.secondary} disabled={pending !== null} onClick={() => save("draft")}>
          {pending === "draft" ? "Saving…" : "Save draft"}
        </button>
        <button type="submit" className={buttonClass.primary} disabled={pending !== null}>
          {pending === "sign" ? "Saving…" : "Sign off"}
        </button>
      </div>
      {notice === "sign" && saved && !saved.complete && (
        <p role="alert" className="text-sm font-semibold text-stop-700">
          Not signed off yet: saved as a draft. Finish the items listed above, then sign off.
        </p>
      )}
      {notice === "draft" && saved && !saved.complete && <p className="text-sm text-ok-700">✓ Draft saved.</p>}
    </form>
  );
}
