import sharp from "sharp";
import { describe, expect, it } from "vitest";
import * as photoLine from "@/app/api/jobs/[id]/photos/line/route";
import { type DecodeLineEntry, decodeLine, inDecodeLine } from "@/server/photos/decode-line";
import { checkAndDerive } from "@/server/photos/process";
import { useFreshDatabase } from "../support/db";
import { makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

function deferred() {
  let release!: () => void;
  const done = new Promise<void>((resolve) => (release = resolve));
  return { done, release };
}

async function until(check: () => boolean) {
  for (let i = 0; i < 2000 && !check(); i++) await new Promise((r) => setTimeout(r, 5));
  expect(check()).toBe(true);
}

const photo = (shade: number) => sharp({ create: { width: 800, height: 600, channels: 3, background: { r: shade, g: shade, b: shade } } }).jpeg().toBuffer();

describe("photos are decoded one at a time", () => {
  it("runs the decodes in the order they joined the line, never two at once", async () => {
    const images = await Promise.all([photo(40), photo(90), photo(140), photo(190)]);
    // Something else is being decoded when the four arrive.
    const hold = deferred();
    const busy = inDecodeLine({ jobId: 8, name: "earlier.jpg", uploadedBy: "s2" }, () => hold.done);
    const finished: string[] = [];
    const checks = images.map((bytes, i) => checkAndDerive(bytes, { jobId: 7, name: `p${i}.jpg`, uploadedBy: "s1" }).then((c) => (finished.push(`p${i}.jpg`), c)));
    await until(() => decodeLine({ jobId: 7 }).length === 4);
    const waiting = decodeLine({ jobId: 7 });
    expect(waiting.map((e) => [e.state, e.ahead])).toEqual([
      ["waiting", 1],
      ["waiting", 2],
      ["waiting", 3],
      ["waiting", 4],
    ]);
    expect(decodeLine()[0]).toMatchObject({ name: "earlier.jpg", state: "decoding", ahead: 0 });

    const seen: DecodeLineEntry[][] = [];
    let watching = true;
    const watch = (async () => {
      while (watching) {
        const now = decodeLine();
        if (JSON.stringify(now) !== JSON.stringify(seen.at(-1))) seen.push(now);
        await new Promise((r) => setImmediate(r));
      }
    })();
    hold.release();
    await busy;
    const results = await Promise.all(checks);
    watching = false;
    await watch;

    expect(results.every((r) => r.ok)).toBe(true);
    expect(finished).toEqual(waiting.map((e) => e.name));
    expect([...finished].sort()).toEqual(["p0.jpg", "p1.jpg", "p2.jpg", "p3.jpg"]);
    expect(seen.reduce((most, line) => Math.max(most, line.filter((e) => e.state === "decoding").length), 0)).toBe(1);
    expect(decodeLine()).toEqual([]);
  }, 30_000);

  it("a failed decode lets the next one through", async () => {
    const broken = inDecodeLine({ jobId: 1, name: "a", uploadedBy: "s" }, async () => {
      throw new Error("damaged");
    });
    const next = inDecodeLine({ jobId: 1, name: "b", uploadedBy: "s" }, async () => "b done");
    await expect(broken).rejects.toThrow("damaged");
    await expect(next).resolves.toBe("b done");
    expect(decodeLine()).toEqual([]);
  });

  it("GET /api/jobs/:id/photos/line shows the signed-in person's photos of that job and how many are ahead", async () => {
    const tech = await makeStaff(db(), "tech");
    const other = await makeStaff(db(), "office");
    const job = await makeJob(db());
    const otherJob = await makeJob(db());
    const hold = deferred();
    const busy = inDecodeLine({ jobId: otherJob.id, name: "held.jpg", uploadedBy: other.id }, () => hold.done);
    const mine = checkAndDerive(await photo(60), { jobId: job.id, name: "pump on PTO.jpg", uploadedBy: tech.id });
    await until(() => decodeLine({ jobId: job.id }).length === 1);

    const get = async (staffId: string, jobId: number) =>
      readBody(await photoLine.GET(request(`/api/jobs/${jobId}/photos/line`, { cookie: await sessionCookieFor(staffId) }), params({ id: String(jobId) })));
    expect(await get(tech.id, job.id)).toEqual({ line: [{ name: "pump on PTO.jpg", state: "waiting", ahead: 1 }] });
    expect(await get(other.id, job.id)).toEqual({ line: [] });

    hold.release();
    await busy;
    expect(await mine).toMatchObject({ ok: true });
    expect(await get(tech.id, job.id)).toEqual({ line: [] });

    const unsigned = await photoLine.GET(request(`/api/jobs/${job.id}/photos/line`), params({ id: String(job.id) }));
    expect(unsigned.status).toBe(401);
    const missing = await photoLine.GET(request(`/api/jobs/99999/photos/line`, { cookie: await sessionCookieFor(tech.id) }), params({ id: "99999" }));
    expect(missing.status).toBe(404);
  }, 30_000);
});
