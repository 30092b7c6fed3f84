import { describe, expect, it } from "vitest";
import * as board from "@/app/api/board/route";
import { listTechs } from "@/server/staff/queries";
import { useFreshDatabase } from "../support/db";
import { makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

describe("who is offered as a job's tech", () => {
  it("the board's Tech filter and the Assigned to list name techs only; a current assignee who is not a tech stays choosable on that job", async () => {
    const owner = await makeStaff(db(), "owner");
    const office = await makeStaff(db(), "office");
    const tech = await makeStaff(db(), "tech");
    await makeStaff(db(), "tech", { active: 0 });
    const res = await board.GET(request("/api/board", { cookie: await sessionCookieFor(office.id) }));
    expect(res.status).toBe(200);
    const { techs } = await readBody(res);
    expect(techs.map((t: { id: string }) => t.id)).toEqual([tech.id]);
    expect((await listTechs(db())).map((t) => t.id)).toEqual([tech.id]);
    expect((await listTechs(db(), owner.id)).map((t) => t.id).sort()).toEqual([owner.id, tech.id].sort());
  });

  it("an empty board tells what the shop has on file for the first steps; a board with jobs, or a filtered one, does not", async () => {
    const office = await makeStaff(db(), "office");
    const cookie = await sessionCookieFor(office.id);
    const read = async (query = "") => (await readBody(await board.GET(request(`/api/board${query}`, { cookie })))).firstSteps;
    expect(await read()).toEqual({ customers: 0, trucks: 0 });
    const customer = await makeCustomer(db());
    expect(await read()).toEqual({ customers: 1, trucks: 0 });
    await makeTruck(db(), customer.id);
    expect(await read()).toEqual({ customers: 1, trucks: 1 });
    expect(await read("?q=WO-NONE")).toBeNull();
    await makeJob(db(), { customerId: customer.id });
    expect(await read()).toBeNull();
  });
});
