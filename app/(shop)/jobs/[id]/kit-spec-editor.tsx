"use client";

import dynamic from "next/dynamic";
import { useState } from "react";
import { buttonClass } from "@/components/form";
import type { KitCalcInput, KitSpec } from "@/server/kit-calc";

// The calculator behind the editor (and its form checks) loads when the editor is opened, so the
// job page does not carry it for everyone who only reads the job.
const OpenEditor = dynamic(() => import("./kit-spec-open-editor").then((m) => m.OpenEditor), {
  ssr: false,
  loading: () => <p className="text-ink-soft">Opening the calculator…</p>,
});

const START_WORDS = {
  spec: (version: number) => `Starts from version ${version}, the spec in force.`,
  truck: (rpm: number) => `No spec yet: starts from the shop's usual kit at this truck's work engine speed, ${rpm} rpm.`,
  shop_default: () => "No spec yet, and the truck has no work engine speed on file: starts from the shop's usual kit. Check the engine speed.",
};

export function KitSpecEditor({
  jobId,
  version,
  start,
  startFrom,
  startAnswer,
}: {
  jobId: number;
  version: number;
  start: KitCalcInput;
  startFrom: "spec" | "truck" | "shop_default";
  startAnswer?: KitSpec;
}) {
  const [open, setOpen] = useState(false);
  const [saved, setSaved] = useState<number | null>(null);
  if (!open) {
    return (
      <div className="flex flex-wrap items-center gap-3 print:hidden">
        <button type="button" className={buttonClass.primary} onClick={() => { setSaved(null); setOpen(true); }}>
          {version ? "Edit kit spec" : "Work out a kit spec"}
        </button>
        {saved !== null && (
          <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
            ✓ Saved version {saved}.
          </p>
        )}
      </div>
    );
  }
  return (
    <OpenEditor
      jobId={jobId}
      version={version}
      start={start}
      startNote={startFrom === "spec" ? START_WORDS.spec(version) : startFrom === "truck" ? START_WORDS.truck(start.engineRpm) : START_WORDS.shop_default()}
      startAnswer={startAnswer}
      onClose={(savedVersion) => {
        setSaved(savedVersion);
        setOpen(false);
      }}
    />
  );
}
