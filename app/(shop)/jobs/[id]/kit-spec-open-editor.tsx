"use client";

// The open kit-spec editor: the calculator and its form checks load only when someone opens it.

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { ApiRequestError, api } from "@/components/api";
import { buttonClass } from "@/components/form";
import { type FormFieldErrors, formErrorsFromApi, parseForm } from "@/components/kit-calc/form-state";
import { KitCalculatorView } from "@/components/kit-calc/kit-calculator";
import { useKitCalc } from "@/components/kit-calc/use-kit-calc";
import type { KitCalcInput, KitSpec } from "@/server/kit-calc";
import type { SavedKitSpec } from "@/server/kit-spec/schemas";

export function OpenEditor({ jobId, version, start, startNote, startAnswer, onClose }: { jobId: number; version: number; start: KitCalcInput; startNote: string; startAnswer?: KitSpec; onClose: (saved: number | null) => void }) {
  const router = useRouter();
  const calc = useKitCalc(start, startAnswer);
  const [expectedVersion, setExpectedVersion] = useState(version);
  const [errors, setErrors] = useState<FormFieldErrors>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [newer, setNewer] = useState<SavedKitSpec | null>(null);
  const [pending, setPending] = useState(false);
  // The server's field errors describe what was sent; once a box changes they no longer apply.
  useEffect(() => setErrors({}), [calc.form]);

  async function save() {
    setProblem(null);
    // Checked at once, not after the typing pause: the save must carry exactly what is in the boxes.
    const parsed = parseForm(calc.form);
    if (!parsed.ok) {
      setErrors(parsed.errors);
      setProblem("Fix the marked boxes, then save.");
      return;
    }
    setErrors({});
    setPending(true);
    try {
      const { spec } = await api<{ spec: SavedKitSpec }>(`/api/jobs/${jobId}/kit-spec`, { method: "PUT", body: { inputs: parsed.input, expectedVersion } });
      router.refresh();
      onClose(spec.version);
    } catch (err) {
      if (!(err instanceof ApiRequestError)) throw err;
      const f = err.failure;
      if (f.code === "stale") {
        setNewer((f.details?.spec as SavedKitSpec | null) ?? null);
        router.refresh();
      } else if (f.code === "validation") {
        setErrors(formErrorsFromApi(f.fields, "inputs."));
      }
      setProblem(f.message);
    } finally {
      setPending(false);
    }
  }

  function takeNewer() {
    if (!newer) return;
    calc.reset(newer.inputs);
    setExpectedVersion(newer.version);
    setNewer(null);
    setProblem(null);
  }

  const actions = (
    <div className="space-y-2 rounded-lg border border-line bg-panel p-3">
      {problem && (
        <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          ⚠ {problem}
        </p>
      )}
      {newer && (
        <div className="space-y-2 rounded-md border border-warn-700/40 bg-warn-100 p-2 text-sm">
          <p>
            Version {newer.version} was saved by {newer.savedBy.name}. Load it to start again from theirs, or save yours over it as version {newer.version + 1}.
          </p>
          <div className="flex flex-wrap gap-2">
            <button type="button" className={buttonClass.secondary} onClick={takeNewer}>
              Load version {newer.version}
            </button>
            <button type="button" className={buttonClass.secondary} onClick={() => { setExpectedVersion(newer.version); setNewer(null); setProblem(null); }}>
              Keep mine
            </button>
          </div>
        </div>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={buttonClass.primary} disabled={pending || newer !== null} onClick={save}>
          {pending ? "Saving…" : `Save kit spec (version ${expectedVersion + 1})`}
        </button>
        <button type="button" className={buttonClass.secondary} onClick={() => onClose(null)}>
          Cancel
        </button>
      </div>
    </div>
  );

  return (
    <div className="space-y-3 border-t border-line pt-4 print:hidden">
      <p className="text-sm text-ink-soft">{startNote} The results are worked out again by the server when you save.</p>
      <KitCalculatorView calc={calc} errors={errors} actions={actions} />
    </div>
  );
}
