import { describe, expect, it, vi } from "vitest";
import { useFreshDatabase } from "../support/db";

// The action reads its request's headers through next/headers; here they are the attacker's.
const sent = vi.hoisted(() => ({ headers: {} as Record<string, string> }));
vi.mock("next/headers", () => ({
  headers: async () => new Headers(sent.headers),
  cookies: async () => ({ get: () => undefined, set: () => {}, has: () => false }),
}));

const { db } = useFreshDatabase();

function ownerForm() {
  const form = new FormData();
  for (const [k, v] of Object.entries({ shopName: "Ridge Upfit", shopPhone: "(555) 010-2200", name: "Dana Quill", email: "dana@ridge.example", password: "a-long-enough-password" })) form.set(k, v);
  return form;
}

describe("first run on an empty database", () => {
  it("refuses a cross-site request with no Origin, and creates no owner", async () => {
    const { createOwnerAction } = await import("@/app/(auth)/first-run/actions");
    sent.headers = { "sec-fetch-site": "cross-site" };
    const result = await createOwnerAction({}, ownerForm());
    expect(result.message).toMatch(/other sites/);
    sent.headers = { origin: "https://elsewhere.example" };
    expect((await createOwnerAction({}, ownerForm())).message).toMatch(/other sites/);
    expect(await db().selectFrom("staff").selectAll().execute()).toEqual([]);
  });

  it("creates the owner from the app's own page", async () => {
    const { createOwnerAction } = await import("@/app/(auth)/first-run/actions");
    sent.headers = { origin: "http://localhost:3000", "sec-fetch-site": "same-origin" };
    await expect(createOwnerAction({}, ownerForm())).rejects.toMatchObject({ digest: expect.stringMatching(/^NEXT_REDIRECT;.*\/board/) });
    expect((await db().selectFrom("staff").select(["email", "role"]).execute())).toEqual([{ email: "dana@ridge.example", role: "owner" }]);
  });

  it("is refused once anyone works here, and adds nobody", async () => {
    const { createOwnerAction } = await import("@/app/(auth)/first-run/actions");
    sent.headers = { origin: "http://localhost:3000", "sec-fetch-site": "same-origin" };
    const before = await db().selectFrom("staff").select(["email", "role"]).execute();
    expect(before.length).toBeGreaterThan(0);
    const second = ownerForm();
    second.set("email", "someone-else@ridge.example");
    second.set("shopName", "Another Name");
    const result = await createOwnerAction({}, second);
    expect(result.message).toBe("This shop is already set up. Sign in instead.");
    expect(await db().selectFrom("staff").select(["email", "role"]).execute()).toEqual(before);
    expect((await db().selectFrom("shop").select("name").executeTakeFirst())?.name).toBe("Ridge Upfit");
  });
});
