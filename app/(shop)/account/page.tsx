import { cookies } from "next/headers";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import { SESSION_COOKIE } from "@/server/auth/lucia";
import { requirePageStaff } from "@/server/auth/session";
import { listDevices } from "@/server/staff/account";
import { recordsSettings } from "@/server/records/queries";
import { DevicesList, PasswordForm } from "./account-forms";

export const metadata = { title: "Your account" };

const ROLE_WORDS = { owner: "Owner", office: "Office", tech: "Tech" } as const;

export default async function AccountPage() {
  const user = await requirePageStaff(undefined, { forPasswordChange: true });
  const jar = await cookies();
  const sessionId = jar.get(SESSION_COOKIE)?.value ?? "";
  const db = getDb();
  const [devices, { timeZone }] = await Promise.all([listDevices(db, user.id, sessionId), recordsSettings(db)]);
  const me = user;
  return (
    <section className="max-w-3xl space-y-4">
      <div>
        <h1 className="text-2xl font-bold">Your account</h1>
        <p className="text-ink-soft">
          {me.name} · {me.email} · {ROLE_WORDS[me.role]}
        </p>
      </div>
      {me.mustChangePassword && (
        <p role="alert" className="rounded-md border-2 border-warn-700/50 bg-warn-100 px-3 py-2 font-semibold text-warn-700">
          You signed in with a temporary password from the owner. Choose your own password to go on.
        </p>
      )}
      <Section title="Change your password" id="password">
        <PasswordForm mustChange={Boolean(me.mustChangePassword)} />
      </Section>
      <Section title="Signed-in devices" id="devices">
        <DevicesList initial={devices} timeZone={timeZone} />
      </Section>
    </section>
  );
}
