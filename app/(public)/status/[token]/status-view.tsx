import { format } from "date-fns";
import { calendarZone, formatShopTime, parseCalendarDate } from "@/server/records/calendar";
import type { StatusView as View } from "@/server/status/queries";
import { type StatusStep, statusSteps } from "@/server/status/route";
import { CUSTOMER_STAGE_NAMES, whatComesNext, whereItIsNow } from "@/server/status/words";

/** A moment (a move) as the day it was at the shop, not in the server's zone. */
const day = (at: string, timeZone: string) => formatShopTime(at, timeZone, "EEE d MMM");

/** The ready date is a calendar day with no time: shown as written, whatever the zone. */
function readyDay(readyBy: string | null) {
  if (!readyBy) return null;
  try {
    return format(parseCalendarDate(readyBy), "EEEE d MMMM", { in: calendarZone });
  } catch {
    return null;
  }
}

function telHref(phone: string) {
  return `tel:${phone.replace(/[^0-9+]/g, "")}`;
}

type Step = StatusStep;
const steps = (view: View): Step[] => statusSteps(view.route, view.stage, view.timeline);

const MARK: Record<Step["state"], { icon: string; word: string; dot: string }> = {
  done: { icon: "✓", word: "Done", dot: "bg-ok-700 text-white" },
  now: { icon: "●", word: "Now", dot: "bg-spark-500 text-white" },
  next: { icon: "○", word: "To come", dot: "border-2 border-line bg-panel text-ink-soft" },
};

/** The truck owner's page: one sentence first, then the timeline, then the photos and the shop's phone. */
export function StatusView({ view, token, repliesRead, price }: { view: View; token: string; repliesRead: boolean; /** The job's quotes, when the shop has sent one. */ price?: React.ReactNode }) {
  const tz = view.shop.timeZone;
  const readyBy = readyDay(view.readyBy);
  const likely = readyDay(view.likelyReadyOn ?? null);
  return (
    <main className="mx-auto max-w-xl px-4 pb-10 pt-5">
      <header className="mb-4">
        <p className="text-sm font-semibold text-bay-700">{view.shop.name}</p>
        <h1 className="mt-1 text-2xl font-bold leading-tight [overflow-wrap:anywhere]" data-testid="job-heading">
          <span className="block">Unit {view.truck.unitNumber}</span>
          <span className="block text-lg font-semibold text-ink-soft">Work order {view.job.workOrder}</span>
          {view.job.description && <span className="mt-1 block text-xl font-semibold">{view.job.description}</span>}
        </h1>
        <p className="mt-1 text-ink-soft">
          {view.truck.year} {view.truck.description} · VIN ending {view.truck.vinTail}
        </p>
      </header>

      <p className="rounded-lg border-l-4 border-bay-700 bg-panel px-4 py-3 text-lg font-semibold leading-snug" data-testid="where-now">
        {whereItIsNow(view.stage)}
      </p>
      <p className="mt-2 px-1 text-ink-soft" data-testid="what-next">
        {whatComesNext(view.stage, view.route, view.linkDays)}
      </p>

      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 rounded-lg bg-bay-50 px-4 py-3">
        <dt className="font-semibold">{view.stage === "ready" || view.stage === "delivered" ? "Status" : "Expected ready"}</dt>
        <dd>{view.stage === "delivered" ? "Picked up" : view.stage === "ready" ? "Ready now" : (readyBy ?? "The shop will confirm the date")}</dd>
        {likely && (
          <>
            <dt className="mt-1 font-semibold">Likely ready</dt>
            <dd className="mt-1" data-testid="likely-ready">
              around {likely} <span className="block text-sm text-ink-soft">An estimate from how long the shop&apos;s recent jobs took at each step; the shop confirms the date.</span>
            </dd>
          </>
        )}
      </dl>

      {price}

      <section aria-labelledby="timeline-title" className="mt-6">
        <h2 id="timeline-title" className="mb-2 text-lg font-bold">Progress</h2>
        <ol className="space-y-0">
          {steps(view).map((s, i, all) => (
            <li key={s.stage} className="relative flex gap-3 pb-4">
              {i < all.length - 1 && <span aria-hidden="true" className="absolute left-[15px] top-8 h-[calc(100%-2rem)] w-0.5 bg-line" />}
              <span aria-hidden="true" className={`grid h-8 w-8 shrink-0 place-items-center rounded-full text-sm font-bold ${MARK[s.state].dot}`}>
                {MARK[s.state].icon}
              </span>
              <div className="min-w-0 pt-1">
                <p className={s.state === "now" ? "font-bold" : s.state === "next" ? "text-ink-soft" : "font-semibold"}>
                  {CUSTOMER_STAGE_NAMES[s.stage]} <span className="text-sm font-normal text-ink-soft">· {MARK[s.state].word}</span>
                </p>
                {s.reachedAt && <p className="text-sm text-ink-soft">{s.state === "now" ? "Since" : "Reached"} {day(s.reachedAt, tz)}</p>}
                {s.backAt && <p className="text-sm text-ink-soft">Back to this step on {day(s.backAt, tz)} for more work</p>}
              </div>
            </li>
          ))}
        </ol>
      </section>

      <section aria-labelledby="photos-title" className="mt-4">
        <h2 id="photos-title" className="mb-2 text-lg font-bold">Photos from the shop</h2>
        {view.photos.length === 0 ? (
          <p className="text-ink-soft">No photos shared yet.</p>
        ) : (
          <ul className="grid grid-cols-2 gap-3">
            {view.photos.map((p) => {
              const scale = Math.min(1, 480 / Math.max(p.width, p.height));
              return (
                <li key={p.id}>
                  <a href={`/status/${token}/photos/${p.id}`} className="block overflow-hidden rounded-md border border-line bg-panel">
                    {/* Plain img: the photo route authorises each request with the link's token. */}
                    <img
                      src={`/status/${token}/photos/${p.id}?size=thumb`}
                      width={Math.round(p.width * scale)}
                      height={Math.round(p.height * scale)}
                      alt={p.caption || `Photo at the ${CUSTOMER_STAGE_NAMES[p.stage].toLowerCase()} step`}
                      loading="lazy"
                      className="aspect-[4/3] h-auto w-full object-cover"
                    />
                  </a>
                  <p className="mt-1 text-sm">{p.caption || CUSTOMER_STAGE_NAMES[p.stage]}</p>
                </li>
              );
            })}
          </ul>
        )}
      </section>

      <footer className="mt-8 rounded-lg border border-line bg-panel p-4">
        <p className="font-semibold">{view.shop.name}</p>
        {view.shop.phone ? (
          <a href={telHref(view.shop.phone)} className="mt-2 inline-flex min-h-11 items-center gap-2 rounded-md bg-bay-700 px-4 py-2 font-semibold text-white">
            <span aria-hidden="true">☎</span> Call {view.shop.phone}
          </a>
        ) : repliesRead ? (
          <p className="text-ink-soft">Reply to the shop&apos;s e-mail to reach them.</p>
        ) : null}
        <p className="mt-3 text-sm text-ink-soft">This page is for you and your team: anyone with the link can see this truck&apos;s progress. It updates as the work moves.</p>
      </footer>
    </main>
  );
}
