/** The trade's cautions where a kit is sized: short, specific, deferring to the makers and local codes. */
export function KitCautions() {
  return (
    <aside aria-labelledby="kit-cautions-title" className="rounded-md border-l-4 border-spark-500 bg-spark-100/60 p-3 text-sm print:break-inside-avoid">
      <h3 id="kit-cautions-title" className="font-bold">
        <span aria-hidden="true">⚠</span> Before the kit runs
      </h3>
      <ul className="mt-1 list-disc space-y-1 pl-5">
        <li>
          Oil under pressure can inject through skin. Never feel for a leak with a hand; relieve pressure before opening a fitting. An injection
          wound needs a doctor at once, even if it looks small.
        </li>
        <li>The relief valve is set by a qualified person, with a gauge, within the pump and PTO makers&rsquo; limits.</li>
        <li>
          Rated pressures come from the pump, hose, fitting and trailer makers, not from this page. Set the relief at or below the lowest of
          them, and never run a hose or fitting whose rating you do not know.
        </li>
        <li>
          Stand clear of a raised deck or a trailer lifted on its cylinders: block it mechanically before working under it. A hose can burst
          at any rating.
        </li>
        <li>These figures size a kit; they do not approve it. Follow the PTO, pump and transmission makers&rsquo; instructions and local codes.</li>
      </ul>
    </aside>
  );
}
