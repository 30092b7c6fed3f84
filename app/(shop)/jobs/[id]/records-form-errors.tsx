"use client";

import { type RefObject, useEffect } from "react";
import type { ApiFailure } from "@/components/api";

/**
 * After a refused save, focus the first field marked invalid and bring it to the middle of the
 * screen. The submit button is disabled while the save is out, so without this the focus falls to
 * <body> and a phone stays at the button, far below the field to fix. A failure that names no
 * field shown on the form focuses `fallback` (the summary beside the button).
 */
export function useFocusFirstInvalid(form: RefObject<HTMLFormElement | null>, failure: ApiFailure | null, fallback: RefObject<HTMLElement | null>) {
  useEffect(() => {
    if (!failure || !form.current) return;
    const target = form.current.querySelector<HTMLElement>('[aria-invalid="true"], [data-invalid="true"]') ?? fallback.current;
    if (!target) return;
    target.focus({ preventScroll: true });
    // A visually hidden radio scrolls its whole row into view, not a 1 px box.
    (target.closest<HTMLElement>("[data-field]") ?? target).scrollIntoView({ block: "center" });
  }, [failure, form, fallback]);
}
