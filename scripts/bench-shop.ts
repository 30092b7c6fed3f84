import { randomUUID } from "node:crypto";
import type SQLite from "better-sqlite3";
import { hashPassword } from "@/server/auth/password";
import { BOARD_STAGES, stagesFor } from "@/server/jobs/stages";
import { formatWorkOrder } from "@/server/jobs/work-order";
import { withCheckDigit } from "@/server/vehicles/vin";

/**
 * A generated shop for measurements: thousands of jobs, most long delivered, a busy board.
 * Written straight through better-sqlite3 in one transaction so it takes seconds, not minutes.
 */
export async function generateShop(sqlite: SQLite.Database, opts: { jobs: number; onBoard: number; password: string }) {
  const hash = await hashPassword(opts.password);
  const now = new Date();
  const iso = now.toISOString();
  const staff = Array.from({ length: 7 }, (_, i) => ({ id: randomUUID(), role: i === 0 ? "owner" : i === 1 ? "office" : "tech", email: i === 0 ? "owner@bench.example" : `staff${i}@bench.example` }));
  const tx = sqlite.transaction(() => {
    sqlite.prepare("insert into shop (id, name, phone, time_zone) values (1, 'Bench Upfit', '(555) 010-9999', 'US/Central')").run();
    const insStaff = sqlite.prepare("insert into staff (id, email, name, role, password_hash, active, created_at) values (?, ?, ?, ?, ?, 1, ?)");
    staff.forEach((s, i) => insStaff.run(s.id, s.email, `Bench Person ${i}`, s.role, hash, iso));
    const techs = staff.filter((s) => s.role === "tech").map((s) => s.id);
    const insCustomer = sqlite.prepare("insert into customer (kind, name, phone, email, notes, created_at) values (?, ?, '', '', '', ?)");
    const insTruck = sqlite.prepare("insert into truck (customer_id, unit_number, vin, year, description, transmission, work_engine_rpm, created_at) values (?, ?, ?, 2024, 'Tandem-axle day cab', '18-speed manual', 1300, ?)");
    const insJob = sqlite.prepare(
      "insert into job (work_order, customer_id, truck_id, scope, description, stage, position, due_on, assigned_tech_id, priority, notes, version, created_at, updated_at) values (?, ?, ?, ?, 'Wet kit with a fabricated reservoir', ?, ?, ?, ?, 'normal', 'Bench notes', 1, ?, ?)",
    );
    const insEvent = sqlite.prepare("insert into stage_event (job_id, from_stage, to_stage, actor_id, at, note) values (?, ?, ?, ?, ?, '')");
    const customers = Math.max(1, Math.round(opts.jobs / 20));
    const trucks: { id: number; customer: number }[] = [];
    for (let c = 1; c <= customers; c++) {
      const customerId = Number(insCustomer.run(c % 5 === 0 ? "owner_operator" : "company", `Bench Customer ${c}`, iso).lastInsertRowid);
      for (let t = 0; t < 3; t++) {
        const n = trucks.length + 1;
        const vin = withCheckDigit(`1BN5T3X20RK${String(n).padStart(6, "0")}`);
        trucks.push({ id: Number(insTruck.run(customerId, `B-${n}`, vin, iso).lastInsertRowid), customer: customerId });
      }
    }
    const positions = new Map<string, number>();
    for (let j = 0; j < opts.jobs; j++) {
      const truck = trucks[j % trucks.length];
      const scope = j % 4 === 0 ? "install_only" : "fabrication";
      const route = stagesFor(scope);
      const boardStages = BOARD_STAGES.filter((s) => route.includes(s));
      const stage = j < opts.onBoard ? boardStages[j % boardStages.length] : "delivered";
      const position = positions.get(stage) ?? 0;
      positions.set(stage, position + 1);
      const due = new Date(now.getTime() + ((j % 30) - 10) * 86_400_000).toISOString().slice(0, 10);
      const jobId = Number(
        insJob.run(formatWorkOrder("WO", 2026, j + 1), truck.customer, truck.id, scope, stage, position, due, techs[j % techs.length], iso, iso).lastInsertRowid,
      );
      const steps = route.slice(0, route.indexOf(stage) + 1);
      steps.forEach((s, i) => insEvent.run(jobId, i === 0 ? null : steps[i - 1], s, techs[j % techs.length], iso));
    }
    sqlite.prepare("update shop set next_work_order = ?").run(opts.jobs + 1);
  });
  tx();
  return { ownerEmail: "owner@bench.example" };
}
