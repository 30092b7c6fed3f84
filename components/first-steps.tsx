import Link from "next/link";
import type { Role } from "@/db/schema";
import { IconCheck } from "./icons";
import { buttonClass } from "./styles";

/**
 * What an empty shop does first: a customer, their truck, then a job. Steps already done are
 * ticked; the next one is a button. A tech is told who adds them.
 */
export function FirstSteps({ counts, role }: { counts: { customers: number; trucks: number }; role: Role }) {
  const steps = [
    { done: counts.customers > 0, label: "Add the first customer", detail: "The company or owner-operator the truck belongs to, and who gets e-mail updates.", href: "/customers/new" },
    { done: counts.trucks > 0, label: "Add their truck", detail: "Unit number, VIN, model year and transmission.", href: "/trucks/new" },
    { done: false, label: "Add the first job", detail: "Its work description, due date and who is assigned. It starts in Queued on the board.", href: "/jobs/new" },
  ];
  const next = steps.findIndex((s) => !s.done);
  return (
    <section aria-labelledby="first-steps" className="max-w-2xl space-y-3 rounded-lg border border-line bg-panel p-4">
      <h2 id="first-steps" className="text-lg font-bold">No jobs yet: first steps</h2>
      {role === "tech" ? (
        <p>The office or the owner adds customers, trucks and jobs. Once they do, jobs show here and on the board.</p>
      ) : (
        <ol className="space-y-3">
          {steps.map((s, i) => (
            <li key={s.href} className="flex gap-3">
              <span aria-hidden="true" className={`grid h-7 w-7 shrink-0 place-items-center rounded-full font-bold ${s.done ? "bg-ok-100 text-ok-700" : "bg-bay-700 text-white"}`}>
                {s.done ? <IconCheck /> : i + 1}
              </span>
              <div className="space-y-1">
                <p className="font-semibold">
                  {s.label}
                  {s.done && <span className="font-normal text-ok-700"> · done</span>}
                </p>
                <p className="text-sm text-ink-soft">{s.detail}</p>
                {i === next && (
                  <Link href={s.href} className={buttonClass.primary}>
                    {s.label}
                  </Link>
                )}
              </div>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
