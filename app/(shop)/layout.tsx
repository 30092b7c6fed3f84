import Link from "next/link";
import { BaywrightMark } from "@/components/mark";
import { Providers } from "@/components/providers";
import { type NavItem, ShellNav, SignOutButton } from "@/components/shell-nav";
import { requirePageStaff } from "@/server/auth/session";

export const dynamic = "force-dynamic";

const ROLE_WORDS = { owner: "Owner", office: "Office", tech: "Tech" } as const;

export default async function ShopLayout({ children }: { children: React.ReactNode }) {
  // Each page decides for itself; the shell also frames /account, where a temporary password is changed.
  const user = await requirePageStaff(undefined, { forPasswordChange: true });
  const items: NavItem[] = [
    { href: "/board", label: "Board" },
    { href: "/jobs", label: "Jobs" },
    { href: "/customers", label: "Customers" },
    { href: "/coating", label: "Coating" },
    { href: "/calculator", label: "Calculator" },
    ...(user.role === "owner"
      ? [
          { href: "/staff", label: "Staff" },
          { href: "/settings", label: "Settings" },
          { href: "/audit", label: "Audit" },
        ]
      : []),
  ];
  return (
    <Providers>
      <header className="border-b border-line bg-panel">
        <div className="mx-auto flex max-w-[1600px] flex-col gap-2 px-4 py-2 md:flex-row md:items-center md:gap-6">
          <div className="flex items-center justify-between gap-3">
            <Link href="/board" className="flex items-center gap-2 font-bold tracking-tight">
              <BaywrightMark />
              <span className="text-lg">Baywright</span>
            </Link>
            <div className="flex items-center gap-1 md:hidden">
              <Link href="/account" className="inline-flex min-h-11 items-center px-1 text-sm text-ink-soft underline-offset-2 hover:underline">
                {user.name.split(" ")[0]} · {ROLE_WORDS[user.role]}
                <span className="sr-only">: your account</span>
              </Link>
              <SignOutButton />
            </div>
          </div>
          <ShellNav items={items} />
          <div className="ml-auto hidden items-center gap-2 md:flex">
            <Link href="/account" className="text-sm text-ink-soft underline-offset-2 hover:underline" data-testid="signed-in-as" title="Your account: password and signed-in devices">
              {user.name} · {ROLE_WORDS[user.role]}
              <span className="sr-only">: your account</span>
            </Link>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-[1600px] px-4 py-4">{children}</main>
    </Providers>
  );
}
