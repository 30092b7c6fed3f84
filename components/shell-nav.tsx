"use client";

import Link from "next/link";
import { usePathname, useRouter } from "next/navigation";
import { api } from "./api";

export interface NavItem {
  href: string;
  label: string;
}

export function ShellNav({ items }: { items: NavItem[] }) {
  const path = usePathname();
  return (
    <nav aria-label="Main" className="relative -mx-4 overflow-x-auto px-4 md:mx-0 md:px-0">
      <ul className="flex gap-1">
        {items.map((item) => {
          const active = path === item.href || path.startsWith(`${item.href}/`);
          return (
            <li key={item.href}>
              <Link
                href={item.href}
                aria-current={active ? "page" : undefined}
                className={`flex min-h-11 items-center whitespace-nowrap rounded-md px-3 font-semibold ${active ? "bg-bay-700 text-white" : "text-bay-900 hover:bg-bay-100"}`}
              >
                {item.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}

export function SignOutButton() {
  const router = useRouter();
  return (
    <button
      type="button"
      className="min-h-11 rounded-md px-3 font-semibold text-bay-900 hover:bg-bay-100"
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
