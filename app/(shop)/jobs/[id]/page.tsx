import type { Metadata } from "next";
import { showStoredDate } from "@/server/http/calendar-date";
import Link from "next/link";
import { Suspense } from "react";
import { notFound } from "next/navigation";
import { Section, SectionLoading } from "@/components/section";
import { StageBadge } from "@/components/stage-badge";
import { getDb } from "@/db";
import { currentStaff, requirePageStaff } from "@/server/auth/session";
import { formatShopTime } from "@/server/records/calendar";
import { shopSettings } from "@/server/shop/queries";
import { findJob, stageEvents } from "@/server/jobs/queries";
import { predictJob } from "@/server/jobs/prediction-queries";
import { SCOPE_LABELS, STAGE_LABELS, stagesFor } from "@/server/jobs/stages";
import { listTechs } from "@/server/staff/queries";
import { BoughtPartsSection } from "./bought-parts-section";
import { JobCostSection, LabourSection } from "./labour-section";
import { JobEditor, MoveControl } from "./job-controls";
import { KitSpecSection } from "./kit-spec-section";
import { LikelyReady } from "./likely-ready";
import { MessagesSection } from "./messages-section";
import { PhotosSection } from "./photos-section";
import { MoneySection } from "./money-section";
import { QuoteSection } from "./quote-section";
import { RecordsSection } from "./records-section";

export async function generateMetadata({ params }: { params: Promise<{ id: string }> }): Promise<Metadata> {
  const raw = (await params).id;
  // Names reach the tab only for signed-in staff; the page itself checks access as before.
  if (!(await currentStaff()) || !/^[1-9]\d{0,9}$/.test(raw)) return { title: "Job" };
  const job = await findJob(getDb(), Number(raw));
  return { title: job ? `${job.workOrder} · Unit ${job.unitNumber}` : "Job not found" };
}

export default async function JobPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageStaff();
  const raw = (await params).id;
  if (!/^[1-9]\d{0,9}$/.test(raw)) notFound();
  const db = getDb();
  const job = await findJob(db, Number(raw));
  if (!job) notFound();
  const [events, techs, shop, prediction] = await Promise.all([stageEvents(db, job.id), listTechs(db, job.assignedTechId), shopSettings(db), predictJob(db, job)]);
  const route = stagesFor(job.scope);

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <p className="text-sm text-ink-soft">
            <Link href="/board" className="inline-flex min-h-11 items-center underline">Board</Link> / <Link href="/jobs" className="inline-flex min-h-11 items-center underline">Jobs</Link>
          </p>
          <h1 className="text-2xl font-bold">
            {job.workOrder} <span className="font-normal text-ink-soft">· {job.customerName}</span>
          </h1>
          <p className="mt-1 flex flex-wrap items-center gap-2">
            <StageBadge stage={job.stage} />
            {job.priority === "rush" && <span className="rounded-full bg-spark-100 px-2.5 py-0.5 text-sm font-bold text-spark-700">▲ Rush</span>}
            <span className="text-ink-soft">Unit {job.unitNumber} · VIN {job.vin} · {job.truckYear} {job.truckDescription}</span>
          </p>
        </div>
        <Link href={`/jobs/${job.id}/sheet`} className="no-print inline-flex min-h-11 items-center rounded-md border border-line bg-panel px-3 font-semibold hover:bg-bay-50">
          Print shop sheet
        </Link>
      </div>

      {/* On a phone the move comes first (the bench's most common action); on a desk it sits top right. */}
      <div className="grid grid-cols-[minmax(0,1fr)] gap-4 lg:grid-cols-[minmax(0,1fr)_380px] lg:grid-rows-[auto_1fr] lg:items-start">
        <div className="no-print lg:col-start-2 lg:row-start-1">
          <Section title="Move this job">
            <MoveControl job={{ id: job.id, stage: job.stage, version: job.version, scope: job.scope }} role={user.role} />
          </Section>
          <div className="mt-4">
            <Suspense fallback={<SectionLoading title="Hours" />}>
              <LabourSection job={job} user={user} />
            </Suspense>
          </div>
        </div>
        <div className="space-y-4 lg:col-start-1 lg:row-span-2 lg:row-start-1">
          <Section title="The job">
            <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2">
              <dt className="font-semibold">Work description</dt>
              <dd>{job.description}</dd>
              <dt className="font-semibold">Work</dt>
              <dd>{SCOPE_LABELS[job.scope]} — stages: {route.filter((s) => s !== "delivered").map((s) => STAGE_LABELS[s]).join(" → ")}</dd>
              <dt className="font-semibold">Due</dt>
              <dd>{job.dueOn ? showStoredDate(job.dueOn, "EEE d MMM yyyy") : "No date set"}</dd>
              <dt className="font-semibold">Likely ready</dt>
              <dd>
                <LikelyReady prediction={prediction} dueOn={job.dueOn} stage={job.stage} />
              </dd>
              <dt className="font-semibold">Assigned</dt>
              <dd>{job.techName ?? "Nobody yet"}</dd>
              <dt className="font-semibold">Truck</dt>
              <dd>
                <Link className="inline-flex min-h-11 items-center underline" href={`/trucks/${job.truckId}`}>Unit {job.unitNumber}</Link> · {job.transmission || "transmission not recorded"}
              </dd>
              <dt className="font-semibold">Customer</dt>
              <dd>
                <Link className="inline-flex min-h-11 items-center underline" href={`/customers/${job.customerId}`}>{job.customerName}</Link>
              </dd>
            </dl>
          </Section>
          {/* Each section reads its own records; the page's head, move and timeline are sent first. */}
          <Suspense fallback={<SectionLoading title="Parts, leak tests and coating" />}>
            <RecordsSection job={job} user={user} />
          </Suspense>
          <Suspense fallback={<SectionLoading title="Bought-in parts" />}>
            <BoughtPartsSection job={job} user={user} />
          </Suspense>
          <Suspense fallback={<SectionLoading title="Kit spec" />}>
            <KitSpecSection job={job} user={user} />
          </Suspense>
          {user.role !== "tech" && (
            <div className="no-print">
              <Suspense fallback={<SectionLoading title="Quote" />}>
                <QuoteSection job={job} user={user} timeZone={shop.timeZone} />
              </Suspense>
              <div className="mt-4">
                <Suspense fallback={<SectionLoading title="Money" />}>
                  <MoneySection job={job} user={user} timeZone={shop.timeZone} />
                </Suspense>
              </div>
            </div>
          )}
          <div className="no-print space-y-4">
            <Suspense fallback={<SectionLoading title="Photos" />}>
              <PhotosSection job={job} user={user} />
            </Suspense>
            <Suspense fallback={<SectionLoading title="Customer e-mail and status link" />}>
              <MessagesSection job={job} user={user} />
            </Suspense>
          </div>
        </div>
        <div className="space-y-4 lg:col-start-2 lg:row-start-2">
          <div className="no-print">
            <Section title={user.role === "tech" ? "Notes" : "Edit the job"}>
              <JobEditor job={job} techs={techs} role={user.role} />
            </Section>
          </div>
          {user.role !== "tech" && (
            <Suspense fallback={<SectionLoading title="Job cost" />}>
              <JobCostSection job={job} />
            </Suspense>
          )}
          <Section title="Stage timeline" id="timeline">
            <ol className="space-y-3">
              {events.map((e) => (
                <li key={e.id} className="border-l-4 border-bay-600 pl-3">
                  <p className="font-semibold">
                    {e.fromStage === null ? `Opened in ${STAGE_LABELS[e.toStage]}` : e.fromStage === e.toStage ? `Reordered in ${STAGE_LABELS[e.toStage]}` : `${STAGE_LABELS[e.fromStage]} → ${STAGE_LABELS[e.toStage]}`}
                  </p>
                  <p className="text-sm text-ink-soft">
                    {formatShopTime(e.at, shop.timeZone, "d MMM yyyy, HH:mm")} · {e.actorName ?? "system"}
                  </p>
                  {e.note && <p className="text-sm">“{e.note}”</p>}
                  {e.overrideReason && <p className="mt-1 rounded bg-warn-100 px-2 py-1 text-sm text-warn-700">⚑ Owner’s override: {e.overrideReason}</p>}
                </li>
              ))}
            </ol>
          </Section>
        </div>
      </div>
    </div>
  );
}
