import Link from "next/link";
import type { Role } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { BaywrightMark } from "./mark";
import { type NavItem, ShellNav } from "./shell-nav";
import { ShellSearch } from "./shell-search";

export const ROLE_WORDS: Record<Role, string> = { owner: "Owner", office: "Office", tech: "Tech" };

/**
 * Every page a role can open from the menu, in the order the shop uses them. Each person's own
 * account page is the signed-in name beside the menu.
 */
export function navItemsFor(role: Role): NavItem[] {
  const desk = role === "tech" ? [] : [{ href: "/", label: "Overview" }];
  return [
    ...desk,
    { href: "/board", label: "Board" },
    { href: "/jobs", label: "Jobs" },
    { href: "/customers", label: "Customers" },
    { href: "/trucks", label: "Trucks" },
    { href: "/coating", label: "Coating" },
    ...(role === "owner" || role === "office" ? [{ href: "/parts", label: "Parts" }, { href: "/job-costs", label: "Hours" }] : []),
    { href: "/calculator", label: "Calculator" },
    ...(role === "owner" || role === "office" ? [{ href: "/prices", label: "Prices" }] : []),
    ...(role === "tech" ? [] : [{ href: "/reports", label: "Reports" }]),
    ...(role === "office" ? [{ href: "/settings", label: "Settings" }] : []),
    ...(role === "owner"
      ? [
          { href: "/staff", label: "Staff" },
          { href: "/settings", label: "Settings" },
          { href: "/audit", label: "Audit" },
        ]
      : []),
  ];
}

/**
 * The signed-in frame around every shop page: a skip link, the mark, the menu and who is signed
 * in. On a phone the menu folds behind one Menu button so every item stays reachable.
 */
export function Shell({ user, children }: { user: Pick<StaffUser, "name" | "role">; children: React.ReactNode }) {
  return (
    <>
      <a
        href="#main"
        className="sr-only z-50 rounded-md bg-bay-900 px-4 py-3 font-semibold text-white focus:not-sr-only focus:fixed focus:top-2 focus:left-2"
      >
        Skip to main content
      </a>
      <header className="no-print border-b border-line bg-panel">
        <div className="mx-auto flex max-w-[1600px] flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <Link href={user.role === "tech" ? "/board" : "/"} className="flex min-h-11 items-center gap-2 font-bold tracking-tight">
            <BaywrightMark />
            {/* On a phone the mark alone, so the Search and Menu buttons fit one row. */}
            <span className="sr-only text-lg sm:not-sr-only">Baywright</span>
          </Link>
          <ShellSearch />
          <ShellNav items={navItemsFor(user.role)} who={`${user.name} · ${ROLE_WORDS[user.role]}`} />
        </div>
      </header>
      <main id="main" tabIndex={-1} className="mx-auto max-w-[1600px] px-4 py-4 focus:outline-none">
        {children}
      </main>
    </>
  );
}
