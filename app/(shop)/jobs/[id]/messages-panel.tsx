"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState } from "react";
import { ApiRequestError, api } from "@/components/api";
import { buttonClass, inputClass } from "@/components/form";
import { type Role, STAGES, type Stage } from "@/db/schema";
import type { MessageRow } from "@/server/email/messages";
import type { JobEmailSettings } from "@/server/email/recipients";
import type { NotifySettings } from "@/server/email/settings";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { formatShopTime } from "@/server/records/calendar";
import { customerMailKeys } from "./customer-mail";

type Link = { id: number; createdAt: string; issuedBy: string | null; revokedAt: string | null; revokedBy: string | null; lastOpenedAt: string | null; state: "active" | "revoked" | "expired"; expiresAt: string | null };

const keys = customerMailKeys;

/** Times as the shop's clock shows them, whatever zone the server or the browser runs in. */
const when = (iso: string, timeZone: string, pattern = "d MMM, HH:mm") => formatShopTime(iso, timeZone, pattern);

function failureText(err: unknown) {
  return err instanceof ApiRequestError ? err.message : "Not saved; try again.";
}

export function MessagesPanel(props: {
  jobId: number;
  role: Role;
  emailConfigured: boolean;
  initialMessages: MessageRow[];
  initialSettings: JobEmailSettings;
  initialLinks: Link[];
  initialShop: NotifySettings;
  timeZone: string;
  /** EMAIL_QUIET_SECONDS, when the server sets the quiet period itself. */
  quietOverrideSeconds?: number | null;
}) {
  const office = props.role === "office" || props.role === "owner";
  return (
    <div className="space-y-5">
      <StatusLinkBox
        jobId={props.jobId}
        office={office}
        initialLinks={props.initialLinks}
        timeZone={props.timeZone}
        recipients={props.initialSettings.emailOff ? [] : props.initialSettings.contacts.filter((c) => c.gets).map((c) => c.name || c.email)}
      />
      <EmailSettingsBox jobId={props.jobId} office={office} initial={props.initialSettings} />
      <MessageList jobId={props.jobId} office={office} emailConfigured={props.emailConfigured} initial={props.initialMessages} timeZone={props.timeZone} />
      {office && <ShopNotifyBox initial={props.initialShop} quietOverrideSeconds={props.quietOverrideSeconds ?? null} />}
    </div>
  );
}

function StatusLinkBox({ jobId, office, initialLinks, timeZone, recipients }: { jobId: number; office: boolean; initialLinks: Link[]; timeZone: string; recipients: string[] }) {
  const queryClient = useQueryClient();
  const links = useQuery({ queryKey: keys.links(jobId), queryFn: () => api<{ links: Link[] }>(`/api/jobs/${jobId}/status-links`).then((r) => r.links), initialData: initialLinks });
  const [fresh, setFresh] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const [asking, setAsking] = useState(false);
  const [emailNew, setEmailNew] = useState(true);
  const [emailedTo, setEmailedTo] = useState<string[]>([]);
  const live = links.data.find((l) => l.state === "active") ?? null;
  const ids = useId();
  const canEmail = recipients.length > 0;

  async function run(work: () => Promise<void>) {
    setPending(true);
    setError(null);
    try {
      await work();
    } catch (err) {
      setError(failureText(err));
    } finally {
      setPending(false);
      await queryClient.invalidateQueries({ queryKey: keys.links(jobId) });
    }
  }
  const issue = () =>
    run(async () => {
      const { link } = await api<{ link: { url: string; emailedTo: string[] } }>(`/api/jobs/${jobId}/status-links`, { method: "POST", body: { emailContacts: live ? emailNew : false } });
      setFresh(link.url);
      setEmailedTo(link.emailedTo);
      setCopied(false);
      setAsking(false);
      if (link.emailedTo.length) await queryClient.invalidateQueries({ queryKey: keys.messages(jobId) });
    });
  const revoke = (id: number) =>
    run(async () => {
      if (!window.confirm("Turn this status link off? Whoever has it will see that it no longer works.")) return;
      await api(`/api/status-links/${id}`, { method: "DELETE" });
      setFresh(null);
    });

  return (
    <div className="space-y-2">
      <h3 className="font-bold">Status link</h3>
      {live ? (
        <p>
          <span className="font-semibold text-ok-700">✓ Working</span> · issued {when(live.createdAt, timeZone)} {live.issuedBy ? `by ${live.issuedBy}` : "with an e-mail to the customer"} · {live.lastOpenedAt ? `last opened ${when(live.lastOpenedAt, timeZone)}` : "not opened yet"}
          {live.expiresAt && ` · ends ${when(live.expiresAt, timeZone, "d MMM yyyy")}`}
        </p>
      ) : (
        <p className="text-ink-soft">– No working link. The next stage e-mail brings one{office ? ", or issue one now to send by hand" : ""}.</p>
      )}
      {fresh && (
        <div className="space-y-1 rounded-md border border-bay-600 bg-bay-50 p-3">
          <label htmlFor={`${ids}-url`} className="block text-sm font-semibold">
            New link: copy it now, it is shown only once. The old link no longer works.
          </label>
          {emailedTo.length > 0 && (
            <p role="status" className="text-sm font-medium text-ok-700">
              ✓ E-mailing it to {emailedTo.join(", ")} now (see Messages to the customer).
            </p>
          )}
          <div className="flex gap-2">
            <input id={`${ids}-url`} readOnly value={fresh} className={`${inputClass} min-w-0 flex-1 font-mono text-sm`} onFocus={(e) => e.currentTarget.select()} data-testid="new-status-link" />
            <button
              type="button"
              className={buttonClass.secondary}
              onClick={async () => {
                await navigator.clipboard?.writeText(fresh).catch(() => undefined);
                setCopied(true);
              }}
            >
              {copied ? "✓ Copied" : "Copy"}
            </button>
          </div>
        </div>
      )}
      {office && asking && live && (
        <div role="group" aria-labelledby={`${ids}-ask`} className="space-y-2 rounded-md border border-warn-700 bg-warn-100 p-3">
          <p id={`${ids}-ask`} className="font-semibold text-warn-700">
            Issue a new link? The current link stops working at once, for everyone who has it.
          </p>
          {canEmail ? (
            <label className="flex min-h-11 items-center gap-3">
              <input type="checkbox" className="h-5 w-5 accent-bay-700" checked={emailNew} onChange={(e) => setEmailNew(e.target.checked)} />
              <span>E-mail the new link now to {recipients.join(", ")}</span>
            </label>
          ) : (
            <p className="text-sm text-ink-soft">Nobody on this job gets e-mail updates, so you will copy the new link and send it yourself.</p>
          )}
          <div className="flex flex-wrap gap-2">
            <button type="button" className={buttonClass.primary} disabled={pending} onClick={issue}>
              {pending ? "Issuing…" : canEmail && emailNew ? "Issue and e-mail the new link" : "Issue the new link"}
            </button>
            <button type="button" className={buttonClass.secondary} disabled={pending} onClick={() => setAsking(false)}>
              Keep the current link
            </button>
          </div>
        </div>
      )}
      {office && !asking && (
        <div className="flex flex-wrap gap-2">
          <button
            type="button"
            className={buttonClass.secondary}
            disabled={pending}
            onClick={() => {
              if (live) {
                setEmailNew(canEmail);
                setAsking(true);
              } else issue();
            }}
          >
            {live ? "Issue a new link…" : "Issue a link"}
          </button>
          {live && (
            <button type="button" className={buttonClass.secondary} disabled={pending} onClick={() => revoke(live.id)}>
              Turn link off
            </button>
          )}
        </div>
      )}
      {error && (
        <p role="alert" className="text-sm font-medium text-stop-700">
          ⚠ {error}
        </p>
      )}
    </div>
  );
}

function EmailSettingsBox({ jobId, office, initial }: { jobId: number; office: boolean; initial: JobEmailSettings }) {
  const [settings, setSettings] = useState(initial);
  const [emailOn, setEmailOn] = useState(!initial.emailOff);
  const [chosen, setChosen] = useState<number[]>(initial.contacts.filter((c) => c.gets).map((c) => c.id));
  const [state, setState] = useState<{ kind: "idle" | "saving" | "saved" } | { kind: "error"; message: string }>({ kind: "idle" });
  const ids = useId();
  const dirty = emailOn === settings.emailOff || chosen.slice().sort().join() !== settings.contacts.filter((c) => c.gets).map((c) => c.id).sort().join();

  async function save() {
    setState({ kind: "saving" });
    try {
      const { settings: next } = await api<{ settings: JobEmailSettings }>(`/api/jobs/${jobId}/email-settings`, { method: "PUT", body: { emailOff: !emailOn, contactIds: chosen } });
      setSettings(next);
      setState({ kind: "saved" });
    } catch (err) {
      setState({ kind: "error", message: failureText(err) });
    }
  }

  return (
    <fieldset className="space-y-2" disabled={!office}>
      <legend className="font-bold">Who gets e-mail about this job</legend>
      {!office && <p className="text-sm text-ink-soft">The office chooses who gets e-mail.</p>}
      <label className="flex min-h-11 items-center gap-3 font-semibold">
        <input type="checkbox" className="h-5 w-5 accent-bay-700" checked={emailOn} onChange={(e) => setEmailOn(e.target.checked)} />
        E-mail the customer at each stage
      </label>
      {!emailOn && <p className="rounded-md bg-warn-100 px-3 py-2 text-sm text-warn-700">⚑ E-mail is off for this job: stage updates are recorded as not sent.</p>}
      {settings.contacts.length === 0 ? (
        <p className="text-sm text-ink-soft">The customer has no contacts yet; add one with an e-mail address on the customer page.</p>
      ) : (
        <ul className="space-y-1">
          {settings.contacts.map((c) => (
            <li key={c.id}>
              <label className="flex min-h-11 items-center gap-3" htmlFor={`${ids}-${c.id}`}>
                <input
                  id={`${ids}-${c.id}`}
                  type="checkbox"
                  className="h-5 w-5 accent-bay-700"
                  disabled={!c.email || !emailOn}
                  checked={chosen.includes(c.id)}
                  onChange={(e) => setChosen((list) => (e.target.checked ? [...list, c.id] : list.filter((id) => id !== c.id)))}
                />
                <span>
                  {c.name} <span className="text-ink-soft">· {c.email || "no e-mail address"}</span>
                </span>
              </label>
            </li>
          ))}
        </ul>
      )}
      {!settings.recipientsChosen && <p className="text-sm text-ink-soft">Until the office saves a choice, e-mail goes to the contacts who get e-mail updates (as ticked on the customer page).</p>}
      {office && (
        <div className="flex items-center gap-3">
          <button type="button" className={buttonClass.primary} disabled={!dirty || state.kind === "saving"} onClick={save}>
            {state.kind === "saving" ? "Saving…" : "Save e-mail choices"}
          </button>
          {state.kind === "saved" && !dirty && <span role="status" className="text-sm font-medium text-ok-700">✓ Saved</span>}
          {state.kind === "error" && (
            <span role="alert" className="text-sm font-medium text-stop-700">
              ⚠ {state.message}
            </span>
          )}
        </div>
      )}
    </fieldset>
  );
}

const STATE_WORDS: Record<MessageRow["state"], { icon: string; word: string; tone: string }> = {
  sent: { icon: "✓", word: "Sent", tone: "bg-ok-100 text-ok-700" },
  waiting: { icon: "…", word: "Waiting to send", tone: "bg-bay-50 text-bay-900" },
  retrying: { icon: "↻", word: "Retrying", tone: "bg-warn-100 text-warn-700" },
  failed: { icon: "⚠", word: "Failed", tone: "bg-stop-100 text-stop-700" },
  skipped: { icon: "–", word: "Not sent", tone: "bg-paper text-ink-soft" },
};

function MessageList({ jobId, office, emailConfigured, initial, timeZone }: { jobId: number; office: boolean; emailConfigured: boolean; initial: MessageRow[]; timeZone: string }) {
  const queryClient = useQueryClient();
  const messages = useQuery({
    queryKey: keys.messages(jobId),
    queryFn: () => api<{ messages: MessageRow[] }>(`/api/jobs/${jobId}/messages`).then((r) => r.messages),
    initialData: initial,
    // While something is on its way, keep the list current without a reload.
    refetchInterval: (q) => (q.state.data?.some((m) => m.state === "waiting" || m.state === "retrying") ? 3_000 : 30_000),
  });
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState<string | null>(null);

  async function act(id: string, what: "resend" | "send-now") {
    setBusy(id);
    setError(null);
    try {
      await api(`/api/messages/${id}/${what}`, { method: "POST" });
    } catch (err) {
      setError(failureText(err));
    } finally {
      setBusy(null);
      await queryClient.invalidateQueries({ queryKey: keys.messages(jobId) });
    }
  }

  return (
    <div className="space-y-2">
      <h3 className="font-bold">Messages to the customer</h3>
      {!emailConfigured && <p className="rounded-md bg-warn-100 px-3 py-2 text-sm text-warn-700">⚑ E-mail is not set up on this server (RESEND_API_KEY): messages wait here until it is.</p>}
      {error && (
        <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          ⚠ {error}
        </p>
      )}
      {messages.data.length === 0 ? (
        <p className="text-ink-soft">No messages yet: the customer is e-mailed when the job moves to a new stage.</p>
      ) : (
        <ul className="divide-y divide-line rounded-md border border-line" data-testid="message-list">
          {messages.data.map((m) => {
            const s = STATE_WORDS[m.state];
            return (
              <li key={m.id} className="space-y-1 p-3">
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <p className="font-semibold">
                    {m.kind === "link_issued" ? "New status link" : m.kind === "quote_sent" ? (m.subject?.startsWith("Change order") ? "Change order with its PDF" : "Quote with its PDF") : m.kind === "invoice_sent" ? "Invoice with its PDF" : m.kind === "payment_received" ? (m.state === "sent" ? "Receipt sent" : "Receipt for a payment") : m.to ? `${m.from ? `${STAGE_LABELS[m.from]} → ` : ""}${STAGE_LABELS[m.to]}` : "Message"}
                    {m.resendOf && <span className="font-normal text-ink-soft"> · sent again</span>}
                  </p>
                  <span className={`rounded-full px-2.5 py-0.5 text-sm font-semibold ${s.tone}`}>
                    <span aria-hidden="true">{s.icon}</span> {s.word}
                    {m.state === "sent" && m.sentAt ? ` ${when(m.sentAt, timeZone)}` : ""}
                  </span>
                </div>
                {m.state === "waiting" && m.goesOutAt && (
                  <div className="flex flex-wrap items-center gap-2 rounded-md bg-bay-50 px-3 py-2" data-testid="goes-out-at">
                    <p className="text-sm font-medium text-bay-900">
                      E-mail goes out at {when(m.goesOutAt, timeZone, "HH:mm")}
                      {m.kind === "stage_changed" && !m.resendOf ? " unless the card moves again" : ""}.
                    </p>
                    {office && (
                      <button type="button" className={buttonClass.secondary} disabled={busy === m.id} onClick={() => act(m.id, "send-now")}>
                        {busy === m.id ? "Sending…" : "Send now"}
                      </button>
                    )}
                  </div>
                )}
                <p className="text-sm text-ink-soft">
                  Written {when(m.createdAt, timeZone)}
                  {m.recipients.length > 0 && ` · to ${m.recipients.join(", ")}`}
                  {m.subject && ` · “${m.subject}”`}
                </p>
                {m.state === "retrying" && (
                  <p className="text-sm text-warn-700">
                    Attempt {m.attempts} did not go through: {m.reason}
                    {m.nextAttemptAt && ` Next try about ${when(m.nextAttemptAt, timeZone, "HH:mm")}.`}
                  </p>
                )}
                {(m.state === "failed" || m.state === "skipped") && m.reason && <p className={`text-sm ${m.state === "failed" ? "text-stop-700" : "text-ink-soft"}`}>{m.reason}</p>}
                {m.state === "sent" && m.reason && <p className="text-sm text-ink-soft">{m.reason}</p>}
                {office && (m.kind === "stage_changed" || m.kind === "quote_sent" || m.kind === "payment_received") && !m.replaced && m.state !== "waiting" && m.state !== "retrying" && (
                  <button type="button" className={buttonClass.secondary} disabled={busy === m.id} onClick={() => act(m.id, "resend")}>
                    {busy === m.id ? "Sending…" : "Send again"}
                  </button>
                )}
              </li>
            );
          })}
        </ul>
      )}
    </div>
  );
}

export function ShopNotifyBox({ initial, quietOverrideSeconds }: { initial: NotifySettings; quietOverrideSeconds: number | null }) {
  const [stages, setStages] = useState<Stage[]>(initial.notifyStages);
  const [days, setDays] = useState(String(initial.statusLinkDays));
  const [quiet, setQuiet] = useState(String(initial.quietMinutes));
  const [state, setState] = useState<{ kind: "idle" | "saving" | "saved" } | { kind: "error"; message: string; fields: Record<string, string[]> }>({ kind: "idle" });
  const ids = useId();

  async function save() {
    setState({ kind: "saving" });
    try {
      const { settings } = await api<{ settings: NotifySettings }>("/api/notify-settings", { method: "PUT", body: { notifyStages: stages, statusLinkDays: Number(days), quietMinutes: Number(quiet) } });
      setStages(settings.notifyStages);
      setDays(String(settings.statusLinkDays));
      setQuiet(String(settings.quietMinutes));
      setState({ kind: "saved" });
    } catch (err) {
      setState({ kind: "error", message: failureText(err), fields: err instanceof ApiRequestError ? err.failure.fields : {} });
    }
  }
  const daysError = state.kind === "error" ? state.fields.statusLinkDays?.join(" ") : undefined;
  const quietError = state.kind === "error" ? state.fields.quietMinutes?.join(" ") : undefined;

  return (
    <details className="rounded-md border border-line p-3">
      <summary className="min-h-11 cursor-pointer py-2 font-bold">Shop-wide e-mail settings</summary>
      <div className="mt-2 space-y-3">
        <fieldset>
          <legend className="text-sm font-semibold">E-mail the customer when a job reaches</legend>
          <ul className="mt-1 grid grid-cols-1 gap-1 sm:grid-cols-2">
            {STAGES.map((s) => (
              <li key={s}>
                <label className="flex min-h-11 items-center gap-3">
                  <input type="checkbox" className="h-5 w-5 accent-bay-700" checked={stages.includes(s)} onChange={(e) => setStages((list) => (e.target.checked ? [...list, s] : list.filter((x) => x !== s)))} />
                  {STAGE_LABELS[s]}
                </label>
              </li>
            ))}
          </ul>
        </fieldset>
        <div className="space-y-1">
          <label htmlFor={`${ids}-days`} className="block text-sm font-semibold">
            Status links keep working after delivery for (days)
          </label>
          <input id={`${ids}-days`} type="number" inputMode="numeric" min={1} max={365} value={days} onChange={(e) => setDays(e.target.value)} aria-invalid={Boolean(daysError)} aria-describedby={`${ids}-days-msg`} className={`${inputClass} max-w-40`} />
          <p id={`${ids}-days-msg`} aria-live="polite" className={daysError ? "text-sm font-medium text-stop-700" : "text-sm text-ink-soft"}>
            {daysError ? `⚠ ${daysError}` : "Before delivery a link never ends."}
          </p>
        </div>
        <div className="space-y-1">
          <label htmlFor={`${ids}-quiet`} className="block text-sm font-semibold">
            Wait after a move before e-mailing (minutes)
          </label>
          <input id={`${ids}-quiet`} type="number" inputMode="numeric" min={0} max={60} value={quiet} onChange={(e) => setQuiet(e.target.value)} aria-invalid={Boolean(quietError)} aria-describedby={`${ids}-quiet-msg`} className={`${inputClass} max-w-40`} />
          <p id={`${ids}-quiet-msg`} aria-live="polite" className={quietError ? "text-sm font-medium text-stop-700" : "text-sm text-ink-soft"}>
            {quietError
              ? `⚠ ${quietError}`
              : quietOverrideSeconds !== null
                ? `This server waits ${quietOverrideSeconds} s instead (EMAIL_QUIET_SECONDS is set), whatever is saved here.`
                : "A card moved again in this time sends one e-mail about where it ended up; moved straight back, none."}
          </p>
        </div>
        <div className="flex items-center gap-3">
          <button type="button" className={buttonClass.primary} disabled={state.kind === "saving"} onClick={save}>
            {state.kind === "saving" ? "Saving…" : "Save shop settings"}
          </button>
          {state.kind === "saved" && <span role="status" className="text-sm font-medium text-ok-700">✓ Saved for every job</span>}
          {state.kind === "error" && !daysError && !quietError && (
            <span role="alert" className="text-sm font-medium text-stop-700">
              ⚠ {state.message}
            </span>
          )}
        </div>
      </div>
    </details>
  );
}
