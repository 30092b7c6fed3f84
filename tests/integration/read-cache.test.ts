import Database from "better-sqlite3";
import { describe, expect, it } from "vitest";
import { cachedUntilWrite } from "@/db/read-cache";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer } from "../support/factories";

const { db } = useFreshDatabase();

describe("answers kept until the shop writes", () => {
  it("builds once for repeat reads, and again after any write", async () => {
    await ensureShop(db());
    let builds = 0;
    const count = () => cachedUntilWrite(db(), "customers", async () => {
      builds += 1;
      return (await db().selectFrom("customer").select(db().fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n;
    });
    expect(await count()).toBe(0);
    expect(await count()).toBe(0);
    expect(builds).toBe(1);
    await makeCustomer(db());
    expect(await count()).toBe(1);
    expect(builds).toBe(2);
  });

  it("sees a write by another connection (a script, a second server)", async () => {
    let builds = 0;
    const count = () => cachedUntilWrite(db(), "customers-other", async () => {
      builds += 1;
      return Number((await db().selectFrom("customer").select(db().fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n);
    });
    const before = await count();
    const other = new Database(process.env.DATABASE_PATH!);
    other.prepare("insert into customer (kind, name, phone, email, notes, created_at) values ('company', 'Second connection', '', '', '', ?)").run(new Date().toISOString());
    other.close();
    expect(await count()).toBe(before + 1);
    expect(builds).toBe(2);
  });

  it("shares one build between readers arriving together, and never keeps a failure", async () => {
    let builds = 0;
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    const slow = () => cachedUntilWrite(db(), "slow", async () => {
      builds += 1;
      await gate;
      return builds;
    });
    const both = Promise.all([slow(), slow()]);
    release();
    expect(await both).toEqual([1, 1]);
    expect(builds).toBe(1);

    let attempts = 0;
    const flaky = () => cachedUntilWrite(db(), "flaky", async () => {
      attempts += 1;
      if (attempts === 1) throw new Error("disk busy");
      return "ok";
    });
    await expect(flaky()).rejects.toThrow("disk busy");
    expect(await flaky()).toBe("ok");
  });

  it("serves an answer past its age at once and builds the fresh one behind it, but waits after a write", async () => {
    await ensureShop(db());
    let clock = 0;
    let builds = 0;
    let release: () => void = () => {};
    const read = () => cachedUntilWrite(db(), "aged", async () => {
      builds += 1;
      const n = builds;
      if (n === 2) await new Promise<void>((r) => (release = r));
      return n;
    }, { refreshAfterMs: 60_000, now: () => clock });
    expect(await read()).toBe(1);
    clock = 30_000;
    expect(await read()).toBe(1);
    expect(builds).toBe(1);
    clock = 61_000;
    // Past its age: the kept answer at once, one build started behind it.
    expect(await read()).toBe(1);
    expect(await read()).toBe(1);
    expect(builds).toBe(2);
    release();
    await new Promise((r) => setTimeout(r, 0));
    expect(await read()).toBe(2);
    // After a write nobody is given the older answer.
    await makeCustomer(db());
    expect(await read()).toBe(3);
  });
});
