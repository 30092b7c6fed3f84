import { Providers } from "@/components/providers";
import { Shell } from "@/components/shell";
import { requirePageStaff } from "@/server/auth/session";

export const dynamic = "force-dynamic";

export default async function ShopLayout({ children }: { children: React.ReactNode }) {
  // Each page decides for itself; the shell also frames /account, where a temporary password is changed.
  const user = await requirePageStaff(undefined, { forPasswordChange: true });
  return (
    <Providers>
      <Shell user={user}>{children}</Shell>
    </Providers>
  );
}
