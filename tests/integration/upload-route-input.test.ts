import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import * as uploads from "@/app/api/uploadthing/route";
import { jsonShapeProblem } from "@/server/http/json-shape";
import { useFreshDatabase } from "../support/db";
import { makeStaff } from "../support/factories";
import { sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function post(cookie: string, body: string) {
  const req = new NextRequest("http://localhost:3000/api/uploadthing?actionType=upload&slug=jobPhoto", {
    method: "POST",
    headers: { cookie, origin: "http://localhost:3000", "content-type": "application/json" },
    body,
  });
  return uploads.POST(req);
}

describe("the upload route with hostile bodies", () => {
  it("a file name with half a UTF-16 pair answers 400 saying what to fix", async () => {
    const tech = await makeStaff(db(), "tech");
    const cookie = await sessionCookieFor(tech.id);
    const res = await post(cookie, `{"files":[{"name":"tank\\ud800.jpg","size":10,"type":"image/jpeg","lastModified":1}],"input":{"jobId":1,"stage":"fabricate"}}`);
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(/rename the file/);
  });

  it("a JSON array 100,000 deep answers 400", async () => {
    const tech = await makeStaff(db(), "tech");
    const cookie = await sessionCookieFor(tech.id);
    const res = await post(cookie, "[".repeat(100_000) + "]".repeat(100_000));
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(/nested too deeply/);
  });

  it("the checks pass an ordinary request and see through strings", () => {
    expect(jsonShapeProblem(`{"files":[{"name":"tank 🛢.jpg"}],"note":"[[[[["}`)).toBeNull();
    expect(jsonShapeProblem(`{"name":"\\udc00"}`)).toMatch(/broken character/);
    expect(jsonShapeProblem(`{"a":`)).toMatch(/not valid JSON/);
  });
});
