import { afterEach, describe, expect, it, vi } from "vitest";
import { customerPatchSchema, newCustomerSchema } from "@/server/customers/schemas";
import { latestModelYear, modelYearSchema, newTruckSchema, truckListQuerySchema, vinSchema } from "@/server/trucks/schemas";
import { VIN_MESSAGES, withCheckDigit } from "@/server/vehicles/vin";

const vin = withCheckDigit("3KM9S6T41NW771506");

describe("newCustomerSchema", () => {
  it("fills the optional fields with empty text and trims what it keeps", () => {
    expect(newCustomerSchema.parse({ kind: "owner_operator", name: "  Dell Okafor " })).toEqual({
      kind: "owner_operator",
      name: "Dell Okafor",
      phone: "",
      email: "",
      notes: "",
      contacts: [],
    });
  });

  it("takes an empty e-mail as none and lower-cases a real one", () => {
    const parsed = newCustomerSchema.parse({ kind: "company", name: "X", email: "", contacts: [{ name: "Y", email: " Ops@Fleet.Example " }] });
    expect(parsed.email).toBe("");
    expect(parsed.contacts[0].email).toBe("ops@fleet.example");
  });

  it("has a contact get e-mail updates by default only when there is an address", () => {
    const parsed = newCustomerSchema.parse({ kind: "company", name: "X", contacts: [{ name: "A", email: "a@fleet.example" }, { name: "B", phone: "(555) 010-0199" }, { name: "C", email: "c@fleet.example", receivesEmail: false }] });
    expect(parsed.contacts.map((c) => c.receivesEmail)).toEqual([true, false, false]);
  });

  it("refuses e-mail updates for a contact with no address, on the e-mail field", () => {
    const result = newCustomerSchema.safeParse({ kind: "company", name: "X", contacts: [{ name: "A", receivesEmail: true }] });
    expect(result.success).toBe(false);
    expect(result.error!.issues).toEqual([expect.objectContaining({ path: ["contacts", 0, "email"], message: expect.stringMatching(/e-mail address/) })]);
  });

  it("holds names to 120 characters and notes to 4000", () => {
    expect(newCustomerSchema.safeParse({ kind: "company", name: "N".repeat(120), notes: "n".repeat(4000) }).success).toBe(true);
    const result = newCustomerSchema.safeParse({ kind: "company", name: "N".repeat(121), notes: "n".repeat(4001) });
    expect(result.error!.issues.map((i) => i.path[0])).toEqual(["name", "notes"]);
  });
});

describe("customerPatchSchema", () => {
  it("refuses an empty patch", () => {
    expect(customerPatchSchema.safeParse({}).success).toBe(false);
  });

  it("adds no defaults, so a patch leaves unsent fields alone", () => {
    expect(customerPatchSchema.parse({ phone: "(555) 010-0142" })).toEqual({ phone: "(555) 010-0142" });
  });

  it("refuses the same contact id twice, naming the second row", () => {
    const result = customerPatchSchema.safeParse({ contacts: [{ id: 4, name: "A" }, { id: 4, name: "B" }] });
    expect(result.error!.issues).toEqual([expect.objectContaining({ path: ["contacts", 1, "id"] })]);
  });
});

describe("truck schemas", () => {
  afterEach(() => vi.useRealTimers());

  it("trims and upper-cases the VIN before checking it", () => {
    expect(vinSchema.parse(` ${vin.toLowerCase()}\n`)).toBe(vin);
  });

  it("says what is wrong with a VIN in the shop's words", () => {
    const wrong = vin.slice(0, 8) + (vin[8] === "1" ? "2" : "1") + vin.slice(9);
    expect(vinSchema.safeParse(wrong).error!.issues[0].message).toBe(VIN_MESSAGES.check_digit);
    expect(vinSchema.safeParse(vin.slice(1)).error!.issues[0].message).toBe(VIN_MESSAGES.length);
  });

  it("reads the latest model year from the clock at parse time", () => {
    vi.useFakeTimers();
    vi.setSystemTime(new Date("2030-12-31T12:00:00Z"));
    expect(latestModelYear()).toBe(2031);
    expect(modelYearSchema.safeParse(2031).success).toBe(true);
    expect(modelYearSchema.safeParse(2032).success).toBe(false);
    vi.setSystemTime(new Date("2032-01-15T12:00:00Z"));
    expect(modelYearSchema.safeParse(2032).success).toBe(true);
  });

  it("defaults a new truck's optional fields and keeps a null engine speed", () => {
    expect(newTruckSchema.parse({ customerId: 1, unitNumber: "DO-1", vin, year: 2022 })).toEqual({
      customerId: 1,
      unitNumber: "DO-1",
      vin,
      year: 2022,
      description: "",
      transmission: "",
      workEngineRpm: null,
      make: "",
      model: "",
      ptoOpening: "",
    });
  });

  it("turns a list filter's customerId into a number and refuses other shapes", () => {
    expect(truckListQuerySchema.parse({ customerId: "12" })).toEqual({ customerId: 12 });
    for (const bad of ["0", "-3", "2.5", "x"]) expect(truckListQuerySchema.safeParse({ customerId: bad }).success, bad).toBe(false);
  });
});
