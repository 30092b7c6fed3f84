import "server-only";
import { createHash } from "node:crypto";
import { type Adapter, type DatabaseSession, type DatabaseUser, Lucia, TimeSpan } from "lucia";
import { type DB, getDb } from "@/db";
import type { Role } from "@/db/schema";

export const SESSION_COOKIE = "bw_session";
/** One shift. The lifetime is absolute: a session is never extended past it. */
export const SESSION_HOURS = 12;

export function hashSessionId(id: string) {
  return createHash("sha256").update(id).digest("hex");
}

/**
 * Lucia adapter over Kysely that stores only a SHA-256 of each session id, so a copy of the
 * database cannot be used to sign in as anyone.
 */
export function kyselyAdapter(db: () => DB): Adapter {
  return {
    async getSessionAndUser(sessionId): Promise<[DatabaseSession | null, DatabaseUser | null]> {
      const row = await db()
        .selectFrom("session")
        .innerJoin("staff", "staff.id", "session.staff_id")
        .select(["session.id", "session.expires_at", "session.user_agent", "staff.id as staff_id", "staff.name", "staff.email", "staff.role", "staff.active", "staff.must_change_password"])
        .where("session.id", "=", hashSessionId(sessionId))
        .executeTakeFirst();
      if (!row || !row.active) return [null, null];
      return [
        { id: sessionId, userId: row.staff_id, expiresAt: new Date(row.expires_at * 1000), attributes: { userAgent: row.user_agent } },
        { id: row.staff_id, attributes: { name: row.name, email: row.email, role: row.role, must_change_password: row.must_change_password } },
      ];
    },
    async getUserSessions(userId) {
      // Only hashes are stored, so the ids cannot be handed back; /account lists devices from the table itself.
      const rows = await db().selectFrom("session").select(["expires_at"]).where("staff_id", "=", userId).execute();
      return rows.map((r, i) => ({ id: `hidden-${i}`, userId, expiresAt: new Date(r.expires_at * 1000), attributes: {} }));
    },
    async setSession(session) {
      await db()
        .insertInto("session")
        .values({
          id: hashSessionId(session.id),
          staff_id: session.userId,
          expires_at: Math.floor(session.expiresAt.getTime() / 1000),
          created_at: new Date().toISOString(),
          // A browser's User-Agent is at most a few hundred characters; a longer one is cut, not refused.
          user_agent: (session.attributes.userAgent ?? "").slice(0, 300),
        })
        .execute();
    },
    // Deliberately a no-op: the shift-long lifetime is absolute, so the stored expiry never moves.
    async updateSessionExpiration() {},
    async deleteSession(sessionId) {
      await db().deleteFrom("session").where("id", "=", hashSessionId(sessionId)).execute();
    },
    async deleteUserSessions(userId) {
      await db().deleteFrom("session").where("staff_id", "=", userId).execute();
    },
    async deleteExpiredSessions() {
      await db().deleteFrom("session").where("expires_at", "<=", Math.floor(Date.now() / 1000)).execute();
    },
  };
}

export const lucia = new Lucia(kyselyAdapter(getDb), {
  sessionExpiresIn: new TimeSpan(SESSION_HOURS, "h"),
  sessionCookie: {
    name: SESSION_COOKIE,
    expires: true,
    attributes: {
      secure: process.env.NODE_ENV === "production" && process.env.INSECURE_COOKIES !== "1",
      sameSite: "lax",
    },
  },
  getUserAttributes: (a) => ({ name: a.name, email: a.email, role: a.role, mustChangePassword: a.must_change_password === 1 }),
});

declare module "lucia" {
  interface Register {
    Lucia: typeof lucia;
    DatabaseUserAttributes: { name: string; email: string; role: Role; must_change_password: number };
    DatabaseSessionAttributes: { userAgent?: string };
  }
}
