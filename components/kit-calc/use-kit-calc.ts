"use client";

import { hashKey, keepPreviousData, useQuery } from "@tanstack/react-query";
import { useEffect, useMemo, useState } from "react";
import { api } from "@/components/api";
import type { KitCalcInput, KitSpec } from "@/server/kit-calc";
import { type KitField, type KitFormState, type TankShape, formStateFromInput, parseForm } from "./form-state";

export const kitCalcKeys = {
  all: ["kit-calc"] as const,
  result: (input: KitCalcInput | null) => ["kit-calc", "result", input] as const,
};

/** A computed kit spec together with the inputs it was computed from, so the page never mixes the two. */
export interface KitCalcAnswer {
  input: KitCalcInput;
  spec: KitSpec;
}

export const TYPING_PAUSE_MS = 300;

export function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return settled;
}

/**
 * The calculator's state: what was typed, the field errors once typing pauses, and the answer from
 * POST /api/kit-calc for the last inputs that passed the schema (kept on screen while the next one loads).
 */
export function useKitCalc(start: KitCalcInput, startAnswer?: KitSpec) {
  const [form, setForm] = useState<KitFormState>(() => formStateFromInput(start));
  const settled = useDebounced(form, TYPING_PAUSE_MS);
  const parsed = useMemo(() => parseForm(settled), [settled]);
  const input = parsed.ok ? parsed.input : null;
  const startHash = useMemo(() => hashKey(kitCalcKeys.result(start)), [start]);
  const key = kitCalcKeys.result(input);

  const query = useQuery({
    queryKey: key,
    queryFn: async ({ signal }): Promise<KitCalcAnswer> => ({ input: input!, spec: await api<KitSpec>("/api/kit-calc", { method: "POST", body: input, signal }) }),
    enabled: input !== null,
    // The same inputs always compute the same answer.
    staleTime: Number.POSITIVE_INFINITY,
    placeholderData: keepPreviousData,
    initialData: startAnswer && hashKey(key) === startHash ? { input: start, spec: startAnswer } : undefined,
  });

  function setField(field: KitField, value: string) {
    setForm((current) => ({ ...current, [field]: value }));
  }

  // Switching shape carries the size across, so a box starts as big as the tube was and the other way round.
  function setShape(shape: TankShape) {
    setForm((current) => {
      if (current.shape === shape) return current;
      if (shape === "box" || shape === "d") {
        return { ...current, shape, tankWidthIn: current.tankWidthIn || current.tankDiameterIn, tankHeightIn: current.tankHeightIn || current.tankDiameterIn };
      }
      return { ...current, shape, tankDiameterIn: current.tankDiameterIn || current.tankHeightIn };
    });
  }

  return {
    form,
    setField,
    setShape,
    reset: (to: KitCalcInput) => setForm(formStateFromInput(to)),
    errors: parsed.ok ? {} : parsed.errors,
    /** True from a keystroke until its answer is on screen. */
    updating: form !== settled || query.isFetching,
    inputsHaveErrors: !parsed.ok,
    answer: query.data ?? null,
    failure: query.error,
    isFetching: query.isFetching,
  };
}
