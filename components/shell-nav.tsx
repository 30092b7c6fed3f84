"use client";

import Link from "next/link";
import { usePathname, useRouter } from "next/navigation";
import { useEffect, useId, useRef, useState } from "react";
import { api } from "./api";

export interface NavItem {
  href: string;
  label: string;
}

/**
 * The main menu. From 1280 px up it is one row (beside the mark from 1440 px); below that a Menu button opens
 * the whole list (each item a full-width 44 px row), so nothing hides off the side of a phone.
 */
export function ShellNav({ items, who }: { items: NavItem[]; who: string }) {
  const path = usePathname();
  const [open, setOpen] = useState(false);
  const listId = useId();
  const button = useRef<HTMLButtonElement>(null);

  // A followed link closes the menu; Escape closes it and gives focus back to the button.
  useEffect(() => setOpen(false), [path]);
  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape") {
        setOpen(false);
        button.current?.focus();
      }
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [open]);

  const current = items.find((i) => path === i.href || path.startsWith(`${i.href}/`));

  return (
    <>
      <button
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls={listId}
        onClick={() => setOpen((o) => !o)}
        className="inline-flex min-h-11 min-w-11 items-center gap-2 rounded-md border border-line px-3 font-semibold text-bay-900 hover:bg-bay-50 xl:hidden"
      >
        <svg viewBox="0 0 24 24" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth={2.2} strokeLinecap="round" aria-hidden="true">
          {open ? <path d="M6 6l12 12M18 6 6 18" /> : <path d="M4 7h16M4 12h16M4 17h16" />}
        </svg>
        Menu
        {current && !open && <span className="font-normal text-ink-soft">· {current.label}</span>}
      </button>
      <div id={listId} className={`${open ? "flex" : "hidden"} w-full flex-col gap-2 pb-2 xl:flex xl:w-auto xl:flex-1 xl:flex-row xl:items-center xl:pb-0`}>
        <nav aria-label="Main" className="xl:flex-1">
          <ul className="flex flex-col gap-1 xl:flex-row">
            {items.map((item) => {
              const active = item === current;
              return (
                <li key={item.href}>
                  <Link
                    href={item.href}
                    aria-current={active ? "page" : undefined}
                    onClick={() => setOpen(false)}
                    className={`flex min-h-11 items-center whitespace-nowrap rounded-md px-3 font-semibold xl:px-1.5 2xl:px-3 ${active ? "bg-bay-700 text-white" : "text-bay-900 hover:bg-bay-100"}`}
                  >
                    {item.label}
                  </Link>
                </li>
              );
            })}
          </ul>
        </nav>
        <div className="flex items-center justify-between gap-2 border-t border-line pt-2 xl:border-0 xl:pt-0">
          <Link
            href="/account"
            aria-current={path === "/account" ? "page" : undefined}
            onClick={() => setOpen(false)}
            className="inline-flex min-h-11 items-center rounded-md px-3 text-sm text-ink-soft underline-offset-2 hover:underline aria-[current=page]:font-semibold aria-[current=page]:text-bay-900"
            data-testid="signed-in-as"
            title="Your account: password and signed-in devices"
          >
            {/* On the desk's one-row menu the name and role stack on two lines rather than wrap anywhere. */}
            <span className="xl:flex xl:flex-col xl:leading-tight">
              <span className="whitespace-nowrap">{who.split(" · ")[0]}</span>
              {who.includes(" · ") && (
                <span className="whitespace-nowrap">
                  <span className="xl:hidden"> · </span>
                  <span className="xl:text-xs">{who.split(" · ").slice(1).join(" · ")}</span>
                </span>
              )}
            </span>
            <span className="sr-only">: your account</span>
          </Link>
          <SignOutButton />
        </div>
      </div>
    </>
  );
}

export function SignOutButton() {
  const router = useRouter();
  return (
    <button
      type="button"
      className="min-h-11 whitespace-nowrap rounded-md px-3 font-semibold text-bay-900 hover:bg-bay-100"
      onClick={async () => {
        await api("/api/session", { method: "DELETE" }).catch(() => undefined);
        router.replace("/sign-in");
        router.refresh();
      }}
    >
      Sign out
    </button>
  );
}
