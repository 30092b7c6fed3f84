import { describe, expect, it } from "vitest";
import { hashSessionId } from "@/server/auth/lucia";
import { deleteExpiredSessions } from "@/server/auth/session-cleanup";
import { useFreshDatabase } from "../support/db";
import { makeStaff } from "../support/factories";

const { db } = useFreshDatabase();

describe("expired sessions", () => {
  it("are deleted; sessions still inside their shift stay", async () => {
    const tech = await makeStaff(db(), "tech");
    const now = new Date("2026-06-01T12:00:00Z");
    const at = (hours: number) => Math.floor(now.getTime() / 1000) + hours * 3600;
    const rows = [
      { id: hashSessionId("ended-yesterday"), expires_at: at(-24) },
      { id: hashSessionId("ended-this-second"), expires_at: at(0) },
      { id: hashSessionId("ends-in-an-hour"), expires_at: at(1) },
      { id: hashSessionId("ends-tonight"), expires_at: at(11) },
    ];
    await db().insertInto("session").values(rows.map((r) => ({ ...r, staff_id: tech.id, created_at: now.toISOString() }))).execute();
    expect(await deleteExpiredSessions(db(), now)).toBe(2);
    const left = (await db().selectFrom("session").select("id").where("staff_id", "=", tech.id).execute()).map((r) => r.id).sort();
    expect(left).toEqual([hashSessionId("ends-in-an-hour"), hashSessionId("ends-tonight")].sort());
    expect(await deleteExpiredSessions(db(), now)).toBe(0);
  });
});
