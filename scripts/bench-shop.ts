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
export async function generateShop(sqlite: SQLite.Database, opts: { jobs: number; onBoard: number; password: string; history?: boolean }) {
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
    // The records a job leaves behind (with `history`): a tested reservoir and a bracket, one leak
    // test, two photos (one the customer sees), and the e-mails of its last two steps.
    const insPart = sqlite.prepare(
      "insert into part (job_id, name, kind, material, shape, needs_leak_test, needs_coating, created_at, updated_at) values (?, ?, ?, 'aluminum', ?, ?, 0, ?, ?)",
    );
    const insTest = sqlite.prepare(
      `insert into leak_test (part_id, rework_count, method, part_shape, test_pressure_psig, gauge_full_scale_psi, gauge_calibrated_on, hold_minutes, start_pressure_psig, end_pressure_psig,
        start_temp_f, end_temp_f, barometric_psia, tester, raw_drop_psi, corrected_drop_psi, allowed_drop_psi, result, recorded_by, tested_at)
       values (?, 0, 'decay', 'round', 5, 15, '2026-01-05', 15, 5.0, 4.99, 70, 70, 14.7, 'Bench Person 2', 0.01, 0.01, 0.05, 'pass', ?, ?)`,
    );
    const insPhoto = sqlite.prepare(
      "insert into photo (job_id, stage, caption, customer_visible, uploaded_by, upload_key, original_name, original_type, original_bytes, width, height, created_at, updated_at) values (?, ?, ?, ?, ?, ?, 'IMG.jpg', 'image/jpeg', 2400000, 1600, 1200, ?, ?)",
    );
    const insOutbox = sqlite.prepare("insert into outbox (id, job_id, kind, payload, status, attempts, next_attempt_at, created_at, sent_at) values (?, ?, 'stage_changed', ?, 'sent', 1, ?, ?, ?)");
    const insEmail = sqlite.prepare(
      "insert into email_message (outbox_id, job_id, from_address, to_addresses, subject, html, text, created_at) values (?, ?, 'shop@bench.example', '[\"fleet@customer.example\"]', ?, ?, ?, ?)",
    );
    const history = (jobId: number, scope: string, steps: string[], tech: string, iso: string) => {
      if (scope === "fabrication") {
        const tank = Number(insPart.run(jobId, "Hydraulic reservoir", "reservoir", "round", 1, iso, iso).lastInsertRowid);
        insPart.run(jobId, "Pump bracket", "bracket", "other", 0, iso, iso);
        if (steps.includes("coating") || steps.includes("install")) insTest.run(tank, tech, iso);
      }
      insPhoto.run(jobId, steps.at(-1), "Kit mounted", 1, tech, `bench-${jobId}-a`, iso, iso);
      insPhoto.run(jobId, steps.at(-1), "Frame rail detail", 0, tech, `bench-${jobId}-b`, iso, iso);
      for (const [from, to] of steps.slice(1).map((s, i) => [steps[i], s]).slice(-2)) {
        const id = randomUUID();
        insOutbox.run(id, jobId, JSON.stringify({ from, to }), iso, iso, iso);
        insEmail.run(id, jobId, `Your truck is at ${to}`, `<p>Your truck moved to ${to}.</p>`, `Your truck moved to ${to}.`, iso);
      }
    };
    // Bought-in parts and hours: a wet kit's six lines per job (received and fitted once the job is
    // past Install, to order or on order before it) and two clock entries per job.
    const insPo = sqlite.prepare("insert into purchase_order (number, supplier, ordered_on, expected_on, notes, created_by, created_at) values (?, ?, ?, ?, '', ?, ?)");
    const insBought = sqlite.prepare(
      "insert into bought_part (job_id, kind, description, part_number, quantity, supplier, unit_cost_cents, state, purchase_order_id, expected_on, received_quantity, created_at, updated_at) values (?, ?, ?, '', ?, ?, ?, ?, ?, ?, ?, ?, ?)",
    );
    const insClock = sqlite.prepare("insert into clock_entry (staff_id, job_id, stage, started_at, ended_at) values (?, ?, ?, ?, ?)");
    const KIT: [string, string, number, number][] = [["pto", "10-bolt PTO", 1, 118_500], ["pump", "Gear pump 3.2 cu in/rev", 1, 64_900], ["valve", "Relief valve", 1, 18_950], ["hose", "Pressure hose 3/4 in", 2, 9_475], ["fitting", "Breakaway coupler pair", 2, 7_820], ["control", "Dash air switch", 1, 6_240]];
    const SUPPLIERS = ["Bench Fluid Power", "Bench Drive Supply", "Bench Hose and Fitting"];
    let poSeq = 0;
    const bought = (jobId: number, stage: string, tech: string, jobIndex: number, lastAt: Date) => {
      const iso = lastAt.toISOString();
      const past = ["install", "wire", "ready", "delivered"].includes(stage);
      const day = new Date(lastAt.getTime() - 3 * 86_400_000).toISOString().slice(0, 10);
      const poId = past || jobIndex % 3 === 0 ? Number(insPo.run(formatWorkOrder("PO", 2026, ++poSeq), SUPPLIERS[jobIndex % 3], day, day, staff[1].id, iso).lastInsertRowid) : null;
      KIT.forEach(([kind, description, quantity, cost], k) => {
        const state = past ? (stage === "install" ? "received" : "installed") : poId ? "ordered" : "needed";
        insBought.run(jobId, kind, description, quantity, SUPPLIERS[(jobIndex + k) % 3], cost, state, poId, poId ? day : null, past ? quantity : 0, iso, iso);
      });
      const start = new Date(lastAt.getTime() - 5 * 3_600_000);
      for (let h = 0; h < 2; h++) {
        const from = new Date(start.getTime() + h * 3 * 3_600_000);
        insClock.run(tech, jobId, stage === "delivered" ? "install" : stage, from.toISOString(), new Date(from.getTime() + 2 * 3_600_000).toISOString());
      }
    };
    // Money as the shop's rules ask for it (money checks on): every job has its approved quote and
    // the deposit paid, so a move into Fabricate passes as it would in the shop; a job at Ready has
    // its open invoice, and a delivered one its invoice paid in full.
    const insQuote = sqlite.prepare(
      `insert into quote (job_id, version, kind, status, tax_millipercent, subtotal_cents, taxable_cents, tax_cents, total_cents, deposit_cents, created_by, created_at, updated_at, sent_at, sent_by, decided_at, decided_name, terms_accepted)
       values (?, 1, 'quote', 'approved', 8250, 1000000, 1000000, 82500, 1082500, 541250, ?, ?, ?, ?, ?, ?, 'Bench Buyer', 1)`,
    );
    const insQuoteLine = sqlite.prepare("insert into quote_line (quote_id, position, kind, description, quantity_milli, unit_price_cents, taxable, amount_cents) values (?, 1, 'part', 'Wet kit, fitted', 1000, 1000000, 1, 1000000)");
    const insPayment = sqlite.prepare("insert into payment (job_id, purpose, method, amount_cents, reference, recorded_by, at) values (?, ?, 'check', ?, 'Bench check', ?, ?)");
    const insInvoice = sqlite.prepare("insert into invoice (job_id, number, status, total_cents, created_by, created_at, sent_at) values (?, ?, ?, 1082500, ?, ?, ?)");
    let invoiceSeq = 0;
    const money = (jobId: number, stage: string, firstAt: string, lastAt: string) => {
      const office = staff[1].id;
      const quoteId = Number(insQuote.run(jobId, office, firstAt, firstAt, firstAt, office, firstAt).lastInsertRowid);
      insQuoteLine.run(quoteId);
      insPayment.run(jobId, "deposit", 541250, office, firstAt);
      if (stage === "ready" || stage === "delivered") {
        insInvoice.run(jobId, formatWorkOrder("INV", 2026, ++invoiceSeq), stage === "delivered" ? "paid" : "open", office, lastAt, lastAt);
        if (stage === "delivered") insPayment.run(jobId, "invoice", 541250, office, lastAt);
      }
    };
    const positions = new Map<string, number>();
    for (let j = 0; j < opts.jobs; j++) {
      const truck = trucks[j % trucks.length];
      const scope = j % 4 === 0 ? "install_only" : "fabrication";
      const route = stagesFor(scope);
      const boardStages = BOARD_STAGES.filter((s) => route.includes(s));
      const stage = j < opts.onBoard ? boardStages[j % boardStages.length] : "delivered";
      const position = positions.get(stage) ?? 0;
      positions.set(stage, position + 1);
      // A shop's history is spread in time: the jobs on the board moved within the last three
      // weeks; delivered jobs went out one every four working hours, newest first, so a larger
      // history reaches further back instead of crowding the last 90 days (an invented pace).
      const steps = route.slice(0, route.indexOf(stage) + 1);
      const lastAt = j < opts.onBoard ? new Date(now.getTime() - (j % 15) * 86_400_000 - (j % 7) * 3_600_000) : new Date(now.getTime() - 86_400_000 - (j - opts.onBoard) * 4 * 3_600_000);
      const stepAt = (i: number) => new Date(lastAt.getTime() - (steps.length - 1 - i) * 36 * 3_600_000).toISOString();
      const due = j < opts.onBoard ? new Date(now.getTime() + ((j % 30) - 10) * 86_400_000).toISOString().slice(0, 10) : new Date(lastAt.getTime() + ((j % 9) - 4) * 86_400_000).toISOString().slice(0, 10);
      const jobId = Number(
        insJob.run(formatWorkOrder("WO", 2026, j + 1), truck.customer, truck.id, scope, stage, position, due, techs[j % techs.length], stepAt(0), lastAt.toISOString()).lastInsertRowid,
      );
      steps.forEach((s, i) => insEvent.run(jobId, i === 0 ? null : steps[i - 1], s, techs[j % techs.length], stepAt(i)));
      money(jobId, stage, stepAt(0), lastAt.toISOString());
      if (opts.history) {
        history(jobId, scope, steps, techs[j % techs.length], lastAt.toISOString());
        bought(jobId, stage, techs[j % techs.length], j, lastAt);
      }
    }
    sqlite.prepare("update shop set next_work_order = ?").run(opts.jobs + 1);
  });
  tx();
  return { ownerEmail: "owner@bench.example" };
}
