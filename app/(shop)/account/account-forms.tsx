"use client";

import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { Field, FormAlert, buttonClass, inputClass, str, useApiForm } from "@/components/form";
import { formatShopTime } from "@/server/records/calendar";
import type { SignedInDevice } from "@/server/staff/account";

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** Current password, then the new one twice; other signed-in devices are signed out, this one stays. */
export function PasswordForm({ mustChange }: { mustChange: boolean }) {
  const router = useRouter();
  const formRef = useRef<HTMLFormElement>(null);
  const [done, setDone] = useState<string | null>(null);
  const form = useApiForm<{ otherDevicesSignedOut: number }>(
    (v) => {
      setDone(null);
      return { path: "/api/me/password", body: { currentPassword: str(v.currentPassword), newPassword: str(v.newPassword), confirmPassword: str(v.confirmPassword) } };
    },
    ({ otherDevicesSignedOut }) => {
      formRef.current?.reset();
      setDone(
        otherDevicesSignedOut > 0
          ? `Password changed. ${plural(otherDevicesSignedOut, "other device was", "other devices were")} signed out; this one stays signed in.`
          : "Password changed. This device stays signed in.",
      );
      if (mustChange) router.replace("/board");
      router.refresh();
    },
  );
  return (
    <form ref={formRef} onSubmit={form.onSubmit} noValidate className="max-w-md space-y-3" aria-label="Change your password">
      <FormAlert failure={form.failure} />
      {done && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
          ✓ {done}
        </p>
      )}
      <Field label={mustChange ? "Temporary password" : "Current password"} name="currentPassword" errors={form.fields.currentPassword} hint={mustChange ? "The one the owner gave you." : undefined}>
        {(p) => <input {...p} type="password" autoComplete="current-password" className={inputClass} />}
      </Field>
      <Field label="New password" name="newPassword" errors={form.fields.newPassword} hint="At least 10 characters. A short sentence is easy to remember.">
        {(p) => <input {...p} type="password" autoComplete="new-password" className={inputClass} />}
      </Field>
      <Field label="New password again" name="confirmPassword" errors={form.fields.confirmPassword} hint="Type it once more so a slip of the finger is caught.">
        {(p) => <input {...p} type="password" autoComplete="new-password" className={inputClass} />}
      </Field>
      <p className="text-sm text-ink-soft">Your other signed-in devices are signed out when you change it; this one stays signed in.</p>
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>
        {form.pending ? "Changing…" : "Change password"}
      </button>
    </form>
  );
}

/** The person's own signed-in devices: sign one out, or every other one. */
export function DevicesList({ initial, timeZone }: { initial: SignedInDevice[]; timeZone: string }) {
  const router = useRouter();
  const [devices, setDevices] = useState(initial);
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const others = devices.filter((d) => !d.current);

  async function run(path: string, done: (answer: { signedOut?: number; signedOutHere?: boolean }) => void) {
    setPending(true);
    setFailure(null);
    setNotice(null);
    try {
      done(await api<{ signedOut?: number; signedOutHere?: boolean }>(path, { method: "DELETE" }));
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
    } finally {
      setPending(false);
    }
  }

  return (
    <div className="space-y-3">
      <FormAlert failure={failure} />
      {notice && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
          ✓ {notice}
        </p>
      )}
      <ul className="divide-y divide-line rounded-md border border-line">
        {devices.map((d) => (
          <li key={d.id} className="flex flex-wrap items-center gap-3 p-3">
            <div className="min-w-48 flex-1">
              <p className="font-semibold">
                {d.device} {d.current && <span className="text-sm font-normal text-ok-700">(this device)</span>}
              </p>
              <p className="text-sm text-ink-soft">
                Signed in {formatShopTime(d.signedInAt, timeZone, "d MMM yyyy, HH:mm")}; signed out by itself at {formatShopTime(d.expiresAt, timeZone, "HH:mm")} (one shift)
              </p>
            </div>
            {d.current ? (
              <button
                type="button"
                className={buttonClass.secondary}
                disabled={pending}
                onClick={() =>
                  run(`/api/me/devices/${d.id}`, () => {
                    router.replace("/sign-in");
                    router.refresh();
                  })
                }
              >
                Sign out here
              </button>
            ) : (
              <button
                type="button"
                className={buttonClass.secondary}
                disabled={pending}
                onClick={() =>
                  run(`/api/me/devices/${d.id}`, () => {
                    setDevices((list) => list.filter((x) => x.id !== d.id));
                    setNotice(`${d.device} is signed out.`);
                  })
                }
              >
                Sign out <span className="sr-only">{d.device}</span>
              </button>
            )}
          </li>
        ))}
      </ul>
      {others.length > 0 ? (
        <button
          type="button"
          className={buttonClass.secondary}
          disabled={pending}
          onClick={() =>
            run("/api/me/devices", ({ signedOut = 0 }) => {
              setDevices((list) => list.filter((x) => x.current));
              setNotice(`${plural(signedOut, "other device is", "other devices are")} signed out.`);
            })
          }
        >
          Sign out other devices
        </button>
      ) : (
        <p className="text-sm text-ink-soft">You are signed in on this device only.</p>
      )}
    </div>
  );
}
