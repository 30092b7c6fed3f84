import { describe, expect, it } from "vitest";
import * as truckItem from "@/app/api/trucks/[id]/route";
import * as trucks from "@/app/api/trucks/route";
import type { Role } from "@/db/schema";
import { VIN_MESSAGES, withCheckDigit } from "@/server/vehicles/vin";
import { useFreshDatabase } from "../support/db";
import { makeCustomer, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function cookieAs(role: Role) {
  return sessionCookieFor((await makeStaff(db(), role)).id);
}

async function truckCount() {
  const row = await db().selectFrom("truck").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
  return Number(row.n);
}

async function truckRow(id: number) {
  return db().selectFrom("truck").selectAll().where("id", "=", id).executeTakeFirstOrThrow();
}

// Invented VINs: a fixed made-up prefix, a serial, and the check digit computed into place.
let serial = 0;
const freshVin = () => withCheckDigit(`2BW4K7R10SH${String(++serial).padStart(6, "0")}`);
/** The same VIN with a wrong 9th character. */
const badCheckDigit = (vin: string) => vin.slice(0, 8) + (vin[8] === "1" ? "2" : "1") + vin.slice(9);

const post = (cookie: string, body: unknown) => trucks.POST(request("/api/trucks", { cookie, body }));
const patch = (cookie: string, id: string | number, body: unknown) =>
  truckItem.PATCH(request(`/api/trucks/${id}`, { method: "PATCH", cookie, body }), params({ id: String(id) }));
const getOne = (cookie: string, id: string | number) => truckItem.GET(request(`/api/trucks/${id}`, { cookie }), params({ id: String(id) }));

async function goodTruck(overrides: Record<string, unknown> = {}) {
  const customer = await makeCustomer(db(), `Fleet ${serial + 1}`);
  return {
    customerId: customer.id,
    unitNumber: "HR-21",
    vin: freshVin(),
    year: 2024,
    description: "Tandem-axle day cab",
    transmission: "18-speed manual",
    workEngineRpm: 1300,
    ...overrides,
  };
}

describe("GET /api/trucks", () => {
  it("lets any staff member list trucks, filtered by ?customerId=", async () => {
    const a = await makeCustomer(db(), "Listing Fleet A");
    const b = await makeCustomer(db(), "Listing Fleet B");
    const mine = await makeTruck(db(), a.id);
    await makeTruck(db(), b.id);
    const cookie = await cookieAs("tech");
    const res = await trucks.GET(request(`/api/trucks?customerId=${a.id}`, { cookie }));
    expect(res.status).toBe(200);
    expect((await readBody(res)).trucks).toEqual([
      {
        id: mine.id,
        customerId: a.id,
        customerName: "Listing Fleet A",
        unitNumber: mine.unit_number,
        vin: mine.vin,
        year: 2024,
        description: "Tandem-axle day cab",
        transmission: "18-speed manual",
        workEngineRpm: 1300,
        createdAt: expect.any(String),
        make: "",
        model: "",
        ptoOpening: "",
      },
    ]);
    const all = (await readBody(await trucks.GET(request("/api/trucks", { cookie })))).trucks;
    expect(all.length).toBeGreaterThanOrEqual(2);
  });

  it("answers 400 on customerId for a filter of another shape", async () => {
    const cookie = await cookieAs("office");
    for (const id of ["abc", "-1", "1.5"]) {
      const res = await trucks.GET(request(`/api/trucks?customerId=${id}`, { cookie }));
      expect(res.status, id).toBe(400);
      expect((await readBody(res)).error.details.fields).toHaveProperty("customerId");
    }
  });
});

describe("POST /api/trucks", () => {
  it("office and owner add a truck (201); the VIN is trimmed and upper-cased", async () => {
    for (const role of ["office", "owner"] as const) {
      const input = await goodTruck();
      const res = await post(await cookieAs(role), { ...input, vin: `  ${input.vin.toLowerCase()} ` });
      expect(res.status).toBe(201);
      const { truck } = await readBody(res);
      expect(truck).toMatchObject({ customerId: input.customerId, unitNumber: "HR-21", vin: input.vin, year: 2024, workEngineRpm: 1300 });
      expect((await truckRow(truck.id)).vin).toBe(input.vin);
    }
  });

  it("takes only the required fields, leaving engine speed unknown", async () => {
    const { customerId, unitNumber, vin, year } = await goodTruck();
    const res = await post(await cookieAs("office"), { customerId, unitNumber, vin, year });
    expect(res.status).toBe(201);
    expect((await readBody(res)).truck).toMatchObject({ description: "", transmission: "", workEngineRpm: null, make: "", model: "", ptoOpening: "" });
  });

  it("records make, model, transmission and PTO opening, the facts a PTO is fitted by, and edits them", async () => {
    const cookie = await cookieAs("office");
    const res = await post(cookie, await goodTruck({ make: "Halvorn", model: "HD-40 day cab", ptoOpening: "6-bolt, left side" }));
    expect(res.status).toBe(201);
    const { truck } = await readBody(res);
    expect(truck).toMatchObject({ make: "Halvorn", model: "HD-40 day cab", transmission: "18-speed manual", ptoOpening: "6-bolt, left side" });
    const row = await db().selectFrom("truck").select(["make", "model", "pto_opening"]).where("id", "=", truck.id).executeTakeFirstOrThrow();
    expect(row).toEqual({ make: "Halvorn", model: "HD-40 day cab", pto_opening: "6-bolt, left side" });
    const edited = await patch(cookie, truck.id, { ptoOpening: "8-bolt, right side", model: "" });
    expect(edited.status).toBe(200);
    expect((await readBody(edited)).truck).toMatchObject({ make: "Halvorn", model: "", ptoOpening: "8-bolt, right side" });
    const tooLong = await patch(cookie, truck.id, { make: "x".repeat(41) });
    expect(tooLong.status).toBe(400);
    expect((await readBody(tooLong)).error.details.fields).toHaveProperty("make");
  });

  it("a tech gets 403 and nothing is added", async () => {
    const before = await truckCount();
    const res = await post(await cookieAs("tech"), await goodTruck());
    expect(res.status).toBe(403);
    expect(await truckCount()).toBe(before);
  });

  it.each([
    ["length", (vin: string) => vin.slice(0, 16)],
    ["length", (vin: string) => `${vin}7`],
    ["characters", (vin: string) => `${vin.slice(0, 10)}O${vin.slice(11)}`],
    ["check_digit", badCheckDigit],
  ] as const)("refuses a malformed VIN (%s) with 400 on vin and adds nothing", async (problem, spoil) => {
    const input = await goodTruck();
    const before = await truckCount();
    const res = await post(await cookieAs("office"), { ...input, vin: spoil(input.vin) });
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields.vin).toEqual([VIN_MESSAGES[problem]]);
    expect(await truckCount()).toBe(before);
  });

  it("refuses a VIN already on file with 409 on vin, whatever its case", async () => {
    const cookie = await cookieAs("office");
    const first = await goodTruck({ unitNumber: "TF-7" });
    expect((await post(cookie, first)).status).toBe(201);
    const before = await truckCount();
    const again = await post(cookie, await goodTruck({ vin: first.vin.toLowerCase(), unitNumber: "TF-9" }));
    expect(again.status).toBe(409);
    const error = (await readBody(again)).error;
    expect(error.code).toBe("conflict");
    expect(error.details.fields.vin[0]).toMatch(/already on file/);
    expect(await truckCount()).toBe(before);
  });

  it("refuses a second truck with the same unit number at one customer (409), allows it at another", async () => {
    const cookie = await cookieAs("owner");
    const first = await goodTruck({ unitNumber: "DO-1" });
    expect((await post(cookie, first)).status).toBe(201);
    const dup = await post(cookie, { ...first, vin: freshVin(), unitNumber: "do-1" });
    expect(dup.status).toBe(409);
    expect((await readBody(dup)).error.details.fields).toHaveProperty("unitNumber");
    expect((await post(cookie, await goodTruck({ unitNumber: "DO-1" }))).status).toBe(201);
  });

  it("refuses an unknown customer with 400 on customerId", async () => {
    const before = await truckCount();
    const res = await post(await cookieAs("office"), await goodTruck({ customerId: 999_999 }));
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields).toHaveProperty("customerId");
    expect(await truckCount()).toBe(before);
  });

  it("accepts model years 1980 through next year and engine speeds 500 to 3000", async () => {
    const cookie = await cookieAs("office");
    const nextYear = new Date().getFullYear() + 1;
    for (const [year, workEngineRpm] of [[1980, 500], [nextYear, 3000]]) {
      const res = await post(cookie, await goodTruck({ year, workEngineRpm }));
      expect(res.status, `${year} ${workEngineRpm}`).toBe(201);
    }
  });

  const nextYear = new Date().getFullYear() + 1;
  it.each([
    ["customerId", { customerId: undefined }],
    ["customerId", { customerId: "1" }],
    ["unitNumber", { unitNumber: undefined }],
    ["unitNumber", { unitNumber: " " }],
    ["unitNumber", { unitNumber: "U".repeat(41) }],
    ["vin", { vin: undefined }],
    ["vin", { vin: 12345678901234567 }],
    ["vin", { vin: "V".repeat(100_000) }],
    ["year", { year: undefined }],
    ["year", { year: 1979 }],
    ["year", { year: nextYear + 1 }],
    ["year", { year: 2020.5 }],
    ["year", { year: "2024" }],
    ["workEngineRpm", { workEngineRpm: 499 }],
    ["workEngineRpm", { workEngineRpm: 3001 }],
    ["workEngineRpm", { workEngineRpm: "1300" }],
    ["description", { description: "d".repeat(201) }],
    ["transmission", { transmission: 18 }],
  ])("answers 400 naming %s and adds nothing", async (field, overrides) => {
    const before = await truckCount();
    const res = await post(await cookieAs("office"), await goodTruck(overrides));
    expect(res.status).toBe(400);
    const error = (await readBody(res)).error;
    expect(error.code).toBe("validation");
    expect(error.details.fields).toHaveProperty([field]);
    expect(await truckCount()).toBe(before);
  });
});

describe("GET /api/trucks/:id", () => {
  it("answers the truck to any staff member", async () => {
    const customer = await makeCustomer(db(), "Reading Fleet");
    const truck = await makeTruck(db(), customer.id);
    const res = await getOne(await cookieAs("tech"), truck.id);
    expect(res.status).toBe(200);
    expect((await readBody(res)).truck).toMatchObject({ id: truck.id, vin: truck.vin, customerName: "Reading Fleet" });
  });

  it("answers 404 for an unknown id and 400 for ids of another shape", async () => {
    const cookie = await cookieAs("tech");
    expect((await getOne(cookie, 999_999)).status).toBe(404);
    for (const id of ["abc", "-1", "1.5"]) expect((await getOne(cookie, id)).status, id).toBe(400);
  });
});

describe("PATCH /api/trucks/:id", () => {
  it("office and owner change only the fields sent; null clears the engine speed", async () => {
    for (const role of ["office", "owner"] as const) {
      const customer = await makeCustomer(db());
      const truck = await makeTruck(db(), customer.id);
      const cookie = await cookieAs(role);
      const res = await patch(cookie, truck.id, { transmission: "12-speed automated manual", workEngineRpm: null });
      expect(res.status).toBe(200);
      expect(await truckRow(truck.id)).toMatchObject({ transmission: "12-speed automated manual", work_engine_rpm: null, vin: truck.vin, unit_number: truck.unit_number });
      expect((await readBody(res)).truck.workEngineRpm).toBeNull();
    }
  });

  it("a tech gets 403 and nothing changes", async () => {
    const customer = await makeCustomer(db());
    const truck = await makeTruck(db(), customer.id);
    const res = await patch(await cookieAs("tech"), truck.id, { unitNumber: "CHANGED" });
    expect(res.status).toBe(403);
    expect((await truckRow(truck.id)).unit_number).toBe(truck.unit_number);
  });

  it("keeps its own VIN, refuses another truck's VIN with 409 and a bad one with 400", async () => {
    const cookie = await cookieAs("office");
    const customer = await makeCustomer(db());
    const a = await makeTruck(db(), customer.id);
    const b = await makeTruck(db(), customer.id);
    expect((await patch(cookie, a.id, { vin: a.vin.toLowerCase(), year: 2023 })).status).toBe(200);
    const taken = await patch(cookie, a.id, { vin: b.vin, year: 2022 });
    expect(taken.status).toBe(409);
    expect((await readBody(taken)).error.details.fields).toHaveProperty("vin");
    const bad = await patch(cookie, a.id, { vin: badCheckDigit(a.vin), year: 2021 });
    expect(bad.status).toBe(400);
    expect((await readBody(bad)).error.details.fields.vin).toEqual([VIN_MESSAGES.check_digit]);
    expect(await truckRow(a.id)).toMatchObject({ vin: a.vin, year: 2023 });
  });

  it("moves a truck to another customer, but not onto a unit number that customer already uses", async () => {
    const cookie = await cookieAs("owner");
    const seller = await makeCustomer(db());
    const buyer = await makeCustomer(db());
    const truck = await makeTruck(db(), seller.id);
    const theirs = await makeTruck(db(), buyer.id);
    const clash = await patch(cookie, truck.id, { customerId: buyer.id, unitNumber: theirs.unit_number });
    expect(clash.status).toBe(409);
    expect((await truckRow(truck.id)).customer_id).toBe(seller.id);
    const moved = await patch(cookie, truck.id, { customerId: buyer.id });
    expect(moved.status).toBe(200);
    expect((await readBody(moved)).truck).toMatchObject({ customerId: buyer.id, customerName: buyer.name });
  });

  it.each([
    ["_", {}],
    ["customerId", { customerId: 999_999 }],
    ["unitNumber", { unitNumber: "" }],
    ["year", { year: 1900 }],
    ["workEngineRpm", { workEngineRpm: 9000 }],
    ["vin", { vin: "SHORT" }],
  ])("answers 400 naming %s and changes nothing", async (field, body) => {
    const customer = await makeCustomer(db());
    const truck = await makeTruck(db(), customer.id);
    const before = await truckRow(truck.id);
    const res = await patch(await cookieAs("office"), truck.id, body);
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields).toHaveProperty([field]);
    expect(await truckRow(truck.id)).toEqual(before);
  });

  it("answers 404 for an unknown id and 400 for ids of another shape", async () => {
    const cookie = await cookieAs("office");
    expect((await patch(cookie, 999_999, { year: 2020 })).status).toBe(404);
    for (const id of ["abc", "-1", "1.5"]) expect((await patch(cookie, id, { year: 2020 })).status, id).toBe(400);
  });
});
