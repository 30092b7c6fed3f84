import { describe, expect, it } from "vitest";
import * as customerItem from "@/app/api/customers/[id]/route";
import * as customers from "@/app/api/customers/route";
import type { Role } from "@/db/schema";
import { useFreshDatabase } from "../support/db";
import { makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function cookieAs(role: Role) {
  return sessionCookieFor((await makeStaff(db(), role)).id);
}

async function count(table: "customer" | "contact") {
  const row = await db().selectFrom(table).select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
  return Number(row.n);
}

async function customerRow(id: number) {
  return db().selectFrom("customer").selectAll().where("id", "=", id).executeTakeFirstOrThrow();
}

async function contactsOf(customerId: number) {
  return db().selectFrom("contact").selectAll().where("customer_id", "=", customerId).orderBy("id").execute();
}

const post = (cookie: string, body: unknown) => customers.POST(request("/api/customers", { cookie, body }));
const patch = (cookie: string, id: string | number, body: unknown) =>
  customerItem.PATCH(request(`/api/customers/${id}`, { method: "PATCH", cookie, body }), params({ id: String(id) }));
const getOne = (cookie: string, id: string | number) => customerItem.GET(request(`/api/customers/${id}`, { cookie }), params({ id: String(id) }));

const harlan = {
  kind: "company",
  name: "Harlan Ridge Heavy Haul",
  phone: "(555) 010-2290",
  email: "Dispatch@Harlan-Ridge.example",
  notes: "Three tractors pulling hydraulic detachable-gooseneck trailers.",
  contacts: [
    { name: "Renee Ashby (dispatch)", email: "dispatch@harlan-ridge.example", phone: "(555) 010-2291" },
    { name: "Walt Kessler (fleet manager)", phone: "(555) 010-2292" },
  ],
};

describe("GET /api/customers", () => {
  it("lets any staff member read the list with truck and open-job counts", async () => {
    const customer = await makeCustomer(db(), "Quillon Gravel Co");
    const truck = await makeTruck(db(), customer.id);
    await makeTruck(db(), customer.id);
    await makeJob(db(), { customerId: customer.id, truckId: truck.id, stage: "install" });
    await makeJob(db(), { customerId: customer.id, truckId: truck.id, stage: "delivered" });
    const res = await customers.GET(request("/api/customers", { cookie: await cookieAs("tech") }));
    expect(res.status).toBe(200);
    const row = (await readBody(res)).customers.find((c: { id: number }) => c.id === customer.id);
    expect(row).toEqual({ id: customer.id, kind: "company", name: "Quillon Gravel Co", phone: "", email: "", truckCount: 2, openJobCount: 1 });
  });

  it("searches customer and contact names with ?q=, taking % literally", async () => {
    const cookie = await cookieAs("office");
    const made = await readBody(await post(cookie, { kind: "owner_operator", name: "Dell Okafor", contacts: [{ name: "Pim Seaborne" }] }));
    await makeCustomer(db(), "Brindle Stone Haulers");
    const search = async (q: string) =>
      (await readBody(await customers.GET(request(`/api/customers?q=${encodeURIComponent(q)}`, { cookie })))).customers.map((c: { name: string }) => c.name);
    expect(await search("okaf")).toEqual(["Dell Okafor"]);
    expect(await search("SEABORNE")).toEqual(["Dell Okafor"]);
    expect(await search("%")).toEqual([]);
    expect(made.customer.kind).toBe("owner_operator");
  });

  it("sorts by trucks when asked", async () => {
    const cookie = await cookieAs("office");
    const many = await makeCustomer(db(), "Sort Test Many");
    await makeTruck(db(), many.id);
    await makeTruck(db(), many.id);
    await makeTruck(db(), many.id);
    const res = await customers.GET(request("/api/customers?sort=trucks&dir=desc", { cookie }));
    const counts = (await readBody(res)).customers.map((c: { truckCount: number }) => c.truckCount);
    expect(counts).toEqual([...counts].sort((a, b) => b - a));
    expect(counts[0]).toBeGreaterThanOrEqual(3);
  });

  it("answers 400 naming the parameter for an overlong search or an unknown sort", async () => {
    const cookie = await cookieAs("tech");
    const long = await customers.GET(request(`/api/customers?q=${"x".repeat(500)}`, { cookie }));
    expect(long.status).toBe(400);
    expect((await readBody(long)).error.details.fields).toHaveProperty("q");
    const sort = await customers.GET(request("/api/customers?sort=vin", { cookie }));
    expect(sort.status).toBe(400);
    expect((await readBody(sort)).error.details.fields).toHaveProperty("sort");
  });
});

describe("POST /api/customers", () => {
  it("office and owner add a customer with contacts (201); e-mails are kept lower-case", async () => {
    for (const role of ["office", "owner"] as const) {
      const res = await post(await cookieAs(role), { ...harlan, name: `${harlan.name} ${role}` });
      expect(res.status).toBe(201);
      const body = await readBody(res);
      expect(body.customer).toMatchObject({ kind: "company", name: `${harlan.name} ${role}`, email: "dispatch@harlan-ridge.example", phone: "(555) 010-2290" });
      expect(body.contacts).toEqual([
        { id: expect.any(Number), name: "Renee Ashby (dispatch)", email: "dispatch@harlan-ridge.example", phone: "(555) 010-2291", receivesEmail: true },
        { id: expect.any(Number), name: "Walt Kessler (fleet manager)", email: "", phone: "(555) 010-2292", receivesEmail: false },
      ]);
      expect(await contactsOf(body.customer.id)).toHaveLength(2);
    }
  });

  it("a tech gets 403 and nothing is added", async () => {
    const before = [await count("customer"), await count("contact")];
    const res = await post(await cookieAs("tech"), harlan);
    expect(res.status).toBe(403);
    expect((await readBody(res)).error.code).toBe("forbidden");
    expect([await count("customer"), await count("contact")]).toEqual(before);
  });

  it.each([
    ["name", { kind: "company" }],
    ["name", { kind: "company", name: "   " }],
    ["name", { kind: "company", name: "N".repeat(121) }],
    ["name", { kind: "company", name: 42 }],
    ["kind", { kind: "fleet", name: "Kind Test" }],
    ["kind", { name: "Kind Test" }],
    ["notes", { kind: "company", name: "Notes Test", notes: "n".repeat(4001) }],
    ["phone", { kind: "company", name: "Phone Test", phone: "5".repeat(31) }],
    ["email", { kind: "company", name: "Mail Test", email: "not-an-address" }],
    ["email", { kind: "company", name: "Mail Test", email: `${"m".repeat(300)}@fleet.example` }],
    ["contacts", { kind: "company", name: "Contacts Test", contacts: "Renee" }],
    ["contacts.0.name", { kind: "company", name: "Contacts Test", contacts: [{ email: "a@fleet.example" }] }],
    ["contacts.1.email", { kind: "company", name: "Contacts Test", contacts: [{ name: "Ok" }, { name: "Bad", email: "nope" }] }],
    ["contacts.0.email", { kind: "company", name: "Contacts Test", contacts: [{ name: "No address", receivesEmail: true }] }],
    ["contacts.0.receivesEmail", { kind: "company", name: "Contacts Test", contacts: [{ name: "X", email: "x@fleet.example", receivesEmail: "yes" }] }],
  ])("answers 400 naming %s and adds nothing", async (field, body) => {
    const cookie = await cookieAs("office");
    const before = [await count("customer"), await count("contact")];
    const res = await post(cookie, body);
    expect(res.status).toBe(400);
    const error = (await readBody(res)).error;
    expect(error.code).toBe("validation");
    expect(error.details.fields).toHaveProperty([field]);
    expect([await count("customer"), await count("contact")]).toEqual(before);
  });

  it("refuses a cross-site post and a body that is not JSON", async () => {
    const cookie = await cookieAs("owner");
    const before = await count("customer");
    const cross = await customers.POST(request("/api/customers", { cookie, body: harlan, headers: { origin: "https://elsewhere.example" } }));
    expect(cross.status).toBe(403);
    const form = await customers.POST(request("/api/customers", { cookie, method: "POST", rawBody: "kind=company&name=X", headers: { "content-type": "application/x-www-form-urlencoded" } }));
    expect(form.status).toBe(415);
    expect(await count("customer")).toBe(before);
  });
});

describe("GET /api/customers/:id", () => {
  it("answers the customer, its contacts and its trucks to any staff member", async () => {
    const made = await readBody(await post(await cookieAs("office"), harlan));
    const truck = await makeTruck(db(), made.customer.id);
    const res = await getOne(await cookieAs("tech"), made.customer.id);
    expect(res.status).toBe(200);
    const body = await readBody(res);
    expect(body.customer).toMatchObject({ id: made.customer.id, name: harlan.name, notes: harlan.notes });
    expect(body.contacts.map((c: { name: string }) => c.name)).toEqual(harlan.contacts.map((c) => c.name));
    expect(body.trucks).toEqual([expect.objectContaining({ id: truck.id, unitNumber: truck.unit_number, vin: truck.vin, customerName: harlan.name })]);
  });

  it("answers 404 for an unknown id and 400 for ids of another shape", async () => {
    const cookie = await cookieAs("tech");
    expect((await getOne(cookie, 999_999)).status).toBe(404);
    for (const id of ["abc", "-1", "1.5", "0", "01", "1e3"]) {
      const res = await getOne(cookie, id);
      expect(res.status, id).toBe(400);
      expect((await readBody(res)).error.details.fields).toHaveProperty("id");
    }
  });
});

describe("PATCH /api/customers/:id", () => {
  it("office and owner change only the fields sent", async () => {
    for (const role of ["office", "owner"] as const) {
      const customer = await makeCustomer(db(), `Patch Me ${role}`);
      const res = await patch(await cookieAs(role), customer.id, { phone: "(555) 010-0142", notes: "Calls ahead." });
      expect(res.status).toBe(200);
      const row = await customerRow(customer.id);
      expect(row).toMatchObject({ name: `Patch Me ${role}`, kind: "company", phone: "(555) 010-0142", notes: "Calls ahead." });
      expect((await readBody(res)).customer.phone).toBe("(555) 010-0142");
    }
  });

  it("a tech gets 403 and nothing changes", async () => {
    const customer = await makeCustomer(db(), "Tech Cannot Edit");
    const res = await patch(await cookieAs("tech"), customer.id, { name: "Renamed", contacts: [] });
    expect(res.status).toBe(403);
    expect((await customerRow(customer.id)).name).toBe("Tech Cannot Edit");
  });

  it("replaces the contact list: sent ids are kept and updated, new rows added, the rest removed", async () => {
    const cookie = await cookieAs("office");
    const made = await readBody(await post(cookie, harlan));
    const [renee, walt] = made.contacts;
    const res = await patch(cookie, made.customer.id, {
      contacts: [
        { id: renee.id, name: "Renee Ashby (dispatch)", email: "renee@harlan-ridge.example", receivesEmail: true },
        { name: "Ora Lindqvist (shop foreman)", phone: "(555) 010-2293" },
      ],
    });
    expect(res.status).toBe(200);
    const rows = await contactsOf(made.customer.id);
    expect(rows.map((r) => r.id)).toContain(renee.id);
    expect(rows.map((r) => r.id)).not.toContain(walt.id);
    expect(rows.find((r) => r.id === renee.id)).toMatchObject({ email: "renee@harlan-ridge.example", receives_email: 1 });
    expect(rows.map((r) => r.name)).toEqual(["Renee Ashby (dispatch)", "Ora Lindqvist (shop foreman)"]);
    expect((await readBody(res)).contacts).toHaveLength(2);
  });

  it("leaves the contacts alone when the patch does not send them, and removes all for []", async () => {
    const cookie = await cookieAs("owner");
    const made = await readBody(await post(cookie, harlan));
    await patch(cookie, made.customer.id, { name: "Harlan Ridge Heavy Haul LLC" });
    expect(await contactsOf(made.customer.id)).toHaveLength(2);
    await patch(cookie, made.customer.id, { contacts: [] });
    expect(await contactsOf(made.customer.id)).toHaveLength(0);
  });

  it("refuses a contact id of another customer with 400 on that row and changes nothing", async () => {
    const cookie = await cookieAs("office");
    const mine = await readBody(await post(cookie, harlan));
    const theirs = await readBody(await post(cookie, { kind: "company", name: "Tamsin Flats Recovery", contacts: [{ name: "Corinne Tamsin" }] }));
    const res = await patch(cookie, mine.customer.id, {
      name: "Should Not Stick",
      contacts: [{ name: "New person" }, { id: theirs.contacts[0].id, name: "Stolen" }],
    });
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields).toHaveProperty(["contacts.1.id"]);
    expect((await customerRow(mine.customer.id)).name).toBe(harlan.name);
    expect((await contactsOf(mine.customer.id)).map((c) => c.name)).toEqual(harlan.contacts.map((c) => c.name));
    expect((await contactsOf(theirs.customer.id)).map((c) => c.name)).toEqual(["Corinne Tamsin"]);
  });

  it.each([
    ["_", {}],
    ["name", { name: "" }],
    ["kind", { kind: "person" }],
    ["email", { email: "at@" }],
    ["notes", { notes: "n".repeat(4001) }],
    ["contacts.1.id", { contacts: [{ id: 1, name: "A" }, { id: 1, name: "B" }] }],
    ["contacts.0.id", { contacts: [{ id: "1", name: "A" }] }],
  ])("answers 400 naming %s and changes nothing", async (field, body) => {
    const cookie = await cookieAs("office");
    const made = await readBody(await post(cookie, harlan));
    const before = [await customerRow(made.customer.id), await contactsOf(made.customer.id)];
    const res = await patch(cookie, made.customer.id, body);
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields).toHaveProperty([field]);
    expect([await customerRow(made.customer.id), await contactsOf(made.customer.id)]).toEqual(before);
  });

  it("answers 404 for an unknown id and 400 for ids of another shape", async () => {
    const cookie = await cookieAs("owner");
    const before = await count("customer");
    expect((await patch(cookie, 999_999, { name: "Ghost" })).status).toBe(404);
    for (const id of ["abc", "-1", "1.5"]) expect((await patch(cookie, id, { name: "Ghost" })).status, id).toBe(400);
    expect(await count("customer")).toBe(before);
  });
});
