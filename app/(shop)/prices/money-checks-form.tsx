"use client";

import { useState } from "react";
import { ApiRequestError, api } from "@/components/api";

/** The owner's "Money checks before work and delivery" switch: saved as soon as it is changed. */
export function MoneyChecksForm({ initial }: { initial: boolean }) {
  const [on, setOn] = useState(initial);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [pending, setPending] = useState(false);

  async function change(next: boolean) {
    // The box follows the hand at once; a refusal puts it back.
    setOn(next);
    setPending(true);
    setMessage(null);
    try {
      const got = await api<{ on: boolean }>("/api/shop-settings/money-checks", { method: "PUT", body: { on: next } });
      setOn(got.on);
      setMessage({ ok: true, text: got.on ? "Saved: on." : "Saved: off." });
    } catch (err) {
      setOn(!next);
      if (err instanceof ApiRequestError) setMessage({ ok: false, text: err.failure.message });
      else throw err;
    } finally {
      setPending(false);
    }
  }

  return (
    <div className="space-y-1">
      <label className="flex min-h-11 items-start gap-3">
        <input type="checkbox" className="mt-1 size-6 shrink-0" checked={on} disabled={pending} onChange={(e) => void change(e.target.checked)} />
        <span>
          <span className="font-semibold">Money checks before work and delivery</span>
          <span className="block text-sm text-ink-soft">
            On: a job needs an approved quote and its deposit before Fabricate (Install for install-only work), and its invoice paid or on account before Delivered. The owner can still override with a reason.
          </span>
        </span>
      </label>
      <p aria-live="polite" className={`text-sm ${message?.ok === false ? "text-stop-700" : "text-ok-700"}`}>
        {message?.text}
      </p>
    </div>
  );
}
