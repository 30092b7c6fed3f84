import Link from "next/link";

/** An empty shop's board: the three things to add, in order, before the first card appears. */
export function FirstSteps({ steps, canOpenJobs }: { steps: { customers: number; trucks: number }; canOpenJobs: boolean }) {
  if (!canOpenJobs) {
    return (
      <section aria-labelledby="first-steps-title" className="rounded-lg border border-line bg-panel p-3">
        <h2 id="first-steps-title" className="font-bold">Nothing on the board yet</h2>
        <p className="text-sm">The office adds customers, their trucks and work orders. Each new job appears here in Queued, ready to move.</p>
      </section>
    );
  }
  const items = [
    { done: steps.customers > 0, href: "/customers/new", text: "Add the first customer", help: "the company or owner-operator the truck belongs to, with a contact who gets e-mail updates." },
    { done: steps.trucks > 0, href: "/trucks/new", text: "Add their truck", help: "unit number and VIN, so the shop can find it on the board." },
    { done: false, href: "/jobs/new", text: "Open the first work order", help: "what the job is for; it appears here in Queued." },
  ];
  return (
    <section aria-labelledby="first-steps-title" className="rounded-lg border border-line bg-panel p-3">
      <h2 id="first-steps-title" className="font-bold">Nothing on the board yet. Three steps to the first job:</h2>
      <ol className="mt-2 space-y-1 text-sm">
        {items.map((item, i) => (
          <li key={item.href} className="flex flex-wrap items-baseline gap-1">
            <span className="font-semibold">{i + 1}.</span>
            <Link href={item.href} className="inline-flex min-h-11 items-center font-semibold text-bay-900 underline">{item.text}</Link>
            <span className="text-ink-soft">— {item.help}</span>
            {item.done && <span className="font-semibold text-ok-700">✓ done</span>}
          </li>
        ))}
      </ol>
    </section>
  );
}
