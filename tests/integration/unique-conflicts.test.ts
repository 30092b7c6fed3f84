import { describe, expect, it } from "vitest";
import * as staff from "@/app/api/staff/route";
import * as vendors from "@/app/api/vendors/route";
import { uniqueConflict } from "@/server/http/errors";
import { useFreshDatabase } from "../support/db";
import { makeStaff } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

describe("two requests for one unique value at once", () => {
  it("add staff four times with one e-mail: one 201, three 409 naming the e-mail, one row", async () => {
    const owner = await makeStaff(db(), "owner");
    const cookie = await sessionCookieFor(owner.id);
    const body = { name: "Rory Vance", email: "rory@shop.example", role: "tech", password: "a-long-enough-password" };
    const answers = await Promise.all([1, 2, 3, 4].map(() => staff.POST(request("/api/staff", { cookie, body }))));
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409, 409, 409]);
    for (const res of answers.filter((r) => r.status === 409)) {
      const { error } = await readBody(res);
      expect(error.code).toBe("conflict");
      expect(Object.keys(error.details.fields)).toEqual(["email"]);
    }
    const rows = await db().selectFrom("staff").select("id").where("email", "=", "rory@shop.example").execute();
    expect(rows).toHaveLength(1);
  });

  it("add one coater twice at once: 201 and 409 naming the name", async () => {
    const office = await makeStaff(db(), "office");
    const cookie = await sessionCookieFor(office.id);
    const answers = await Promise.all([1, 2].map(() => vendors.POST(request("/api/vendors", { cookie, body: { name: "Prairie Powder Works", usualTurnaroundDays: 10 } }))));
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409]);
  });
});

describe("the shared conflict answer", () => {
  it("names the field for a known column and for any other", () => {
    const known = uniqueConflict(Object.assign(new Error("UNIQUE constraint failed: truck.vin"), { code: "SQLITE_CONSTRAINT_UNIQUE" }));
    expect(known?.status).toBe(409);
    expect(known?.details).toEqual({ fields: { vin: [expect.stringMatching(/VIN/)] } });
    const other = uniqueConflict(Object.assign(new Error("UNIQUE constraint failed: shelf.bin_label"), { code: "SQLITE_CONSTRAINT_UNIQUE" }));
    expect(Object.keys((other?.details as { fields: object }).fields)).toEqual(["binLabel"]);
    expect(uniqueConflict(new Error("disk I/O error"))).toBeNull();
  });
});
