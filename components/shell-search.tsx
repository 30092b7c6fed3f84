"use client";

import { usePathname, useRouter } from "next/navigation";
import { useEffect, useId, useRef, useState } from "react";
import { api, ApiRequestError } from "./api";

interface Hit {
  id: number;
  title: string;
  detail: string;
  href: string;
}
interface Answer {
  q: string;
  groups: { kind: string; label: string; total: number; hits: Hit[] }[];
  hint: string | null;
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The one search box: a Search button in the header (the `/` key opens it from anywhere but a
 * text field) opens a panel; typing searches jobs, trucks, customers, contacts, parts, coaters and
 * photo captions at once. Up and Down move through the results, Enter opens one, Escape closes.
 */
export function ShellSearch() {
  const [open, setOpen] = useState(false);
  const [q, setQ] = useState("");
  const [asked, setAsked] = useState("");
  const [active, setActive] = useState(0);
  const trigger = useRef<HTMLButtonElement>(null);
  const input = useRef<HTMLInputElement>(null);
  const panel = useRef<HTMLDivElement>(null);
  const router = useRouter();
  const path = usePathname();
  const listId = useId();

  useEffect(() => {
    const t = setTimeout(() => setAsked(q.trim()), 150);
    return () => clearTimeout(t);
  }, [q]);
  // Plain fetches (no query cache): the shell also frames the not-found page, outside the providers.
  const [data, setData] = useState<Answer | undefined>(undefined);
  const [isFetching, setFetching] = useState(false);
  const [error, setError] = useState<Error | null>(null);
  useEffect(() => {
    if (!open || [...asked].length < 3) return;
    const abort = new AbortController();
    setFetching(true);
    api<Answer>(`/api/search?q=${encodeURIComponent(asked)}`, { signal: abort.signal })
      .then((answer) => {
        setData(answer);
        setError(null);
      })
      .catch((err: unknown) => {
        if (err instanceof ApiRequestError) setError(err);
      })
      .finally(() => {
        if (!abort.signal.aborted) setFetching(false);
      });
    return () => abort.abort();
  }, [asked, open]);
  const answer = [...asked].length >= 3 && data?.q === asked ? data : undefined;
  const hits = answer?.groups.flatMap((g) => g.hits.map((h) => ({ ...h, key: `${g.kind}-${h.id}` }))) ?? [];

  useEffect(() => setActive(0), [asked, data]);
  useEffect(() => setOpen(false), [path]);
  useEffect(() => {
    if (open) input.current?.focus();
  }, [open]);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== "/" || e.metaKey || e.ctrlKey || e.altKey) return;
      const target = e.target as HTMLElement | null;
      if (target?.closest("input, textarea, select, [contenteditable=''], [contenteditable='true']")) return;
      e.preventDefault();
      setOpen(true);
      input.current?.focus();
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, []);
  useEffect(() => {
    if (!open) return;
    const onDown = (e: PointerEvent) => {
      if (panel.current?.contains(e.target as Node) || trigger.current?.contains(e.target as Node)) return;
      setOpen(false);
    };
    document.addEventListener("pointerdown", onDown);
    return () => document.removeEventListener("pointerdown", onDown);
  }, [open]);

  const close = () => {
    setOpen(false);
    trigger.current?.focus();
  };
  const go = (href: string) => {
    setOpen(false);
    router.push(href);
  };
  const onKeyDown = (e: React.KeyboardEvent) => {
    if (e.key === "Escape") {
      e.preventDefault();
      close();
    } else if (e.key === "ArrowDown" && hits.length) {
      e.preventDefault();
      setActive((a) => (a + 1) % hits.length);
    } else if (e.key === "ArrowUp" && hits.length) {
      e.preventDefault();
      setActive((a) => (a - 1 + hits.length) % hits.length);
    } else if (e.key === "Enter" && hits[active]) {
      e.preventDefault();
      go(hits[active].href);
    }
  };

  let index = -1;
  const status = !open
    ? ""
    : [...q.trim()].length < 3
      ? "Type at least 3 letters or digits: a work order, a word of the work description, a customer or contact, a unit number, the last 6 of a VIN, a part, a coater or a photo caption."
      : error
        ? error.message
        : answer
          ? answer.groups.length
            ? `${plural(hits.length, "result", "results")} shown. Up and Down to choose, Enter to open.`
            : `Nothing matches \u201c${answer.q}\u201d.`
          : isFetching
            ? "Searching…"
            : "";

  return (
    <div className="relative ml-auto xl:order-last xl:ml-0">
      <button
        ref={trigger}
        type="button"
        aria-expanded={open}
        aria-haspopup="dialog"
        aria-keyshortcuts="/"
        onClick={() => (open ? close() : setOpen(true))}
        className="inline-flex min-h-11 min-w-11 items-center gap-2 rounded-md border border-line px-3 font-semibold text-bay-900 hover:bg-bay-50"
      >
        <svg viewBox="0 0 24 24" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth={2.2} strokeLinecap="round" aria-hidden="true">
          <circle cx="11" cy="11" r="7" />
          <path d="m20 20-3.5-3.5" />
        </svg>
        <span className="sr-only sm:not-sr-only xl:sr-only 2xl:not-sr-only">Search</span>
        <kbd className="hidden rounded border border-line px-1.5 text-xs font-normal text-ink-soft 2xl:inline">/</kbd>
      </button>
      {open && (
        <div
          ref={panel}
          role="dialog"
          aria-label="Search the shop"
          className="fixed inset-x-2 top-16 z-40 max-h-[80vh] overflow-y-auto rounded-lg border-2 border-bay-700 bg-panel p-3 shadow-xl sm:absolute sm:inset-x-auto sm:top-12 sm:right-0 sm:w-[34rem]"
          onKeyDown={onKeyDown}
        >
          <label className="block text-sm font-semibold" htmlFor={`${listId}-input`}>
            Search jobs, trucks, customers, parts, coaters and photos
          </label>
          <input
            ref={input}
            id={`${listId}-input`}
            type="search"
            role="combobox"
            aria-expanded={hits.length > 0}
            aria-controls={listId}
            aria-autocomplete="list"
            aria-activedescendant={hits[active] ? `${listId}-${hits[active].key}` : undefined}
            autoComplete="off"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            placeholder="Work order, description, unit, VIN, name…"
            className="mt-1 block min-h-11 w-full rounded-md border border-line bg-panel px-3 py-2 text-base text-ink shadow-inner focus:border-bay-600"
          />
          <p role="status" className="mt-2 text-sm text-ink-soft">{status}</p>
          <div id={listId} role="listbox" aria-label="Results" className="mt-1">
            {answer?.groups.map((g) => (
              <div key={g.kind} role="group" aria-labelledby={`${listId}-${g.kind}`} className="mt-2">
                <div id={`${listId}-${g.kind}`} role="presentation" className="px-2 text-xs font-bold tracking-wide text-ink-soft uppercase">
                  {g.label}
                  {g.total > g.hits.length && <span className="font-normal normal-case"> · newest {g.hits.length} of {g.total}</span>}
                </div>
                {g.hits.map((h) => {
                  index += 1;
                  const i = index;
                  const key = `${g.kind}-${h.id}`;
                  return (
                    <div
                      key={key}
                      id={`${listId}-${key}`}
                      role="option"
                      aria-selected={i === active}
                      onPointerEnter={() => setActive(i)}
                      onClick={() => go(h.href)}
                      className={`flex min-h-11 cursor-pointer flex-col justify-center rounded-md px-2 py-1 ${i === active ? "bg-bay-700 text-white" : "hover:bg-bay-50"}`}
                    >
                      <span className="truncate font-semibold">{h.title}</span>
                      <span className={`truncate text-sm ${i === active ? "text-white" : "text-ink-soft"}`}>{h.detail}</span>
                    </div>
                  );
                })}
              </div>
            ))}
          </div>
        </div>
      )}
    </div>
  );
}
