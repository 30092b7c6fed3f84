import { Providers } from "@/components/providers";
import { Shell } from "@/components/shell";
import { requirePageStaff } from "@/server/auth/session";

export const dynamic = "force-dynamic";

export default async function ShopLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageStaff();
  return (
    <Providers>
      <Shell user={user}>{children}</Shell>
    </Providers>
  );
}
