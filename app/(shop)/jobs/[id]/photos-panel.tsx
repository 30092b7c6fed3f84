"use client";

import type { generateReactHelpers } from "@uploadthing/react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useRef, useState } from "react";
import { ApiRequestError, api } from "@/components/api";
import { buttonClass, inputClass } from "@/components/form";
import type { Role, Stage } from "@/db/schema";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { formatShopTime } from "@/server/records/calendar";
import type { JobPhoto } from "@/server/photos/queries";
import type { PhotoRouter } from "@/server/photos/router";
import { MAX_PHOTOS_PER_UPLOAD, MAX_PHOTO_BYTES, PHOTO_TYPES } from "@/server/photos/limits";

// The upload client loads when the first photo is sent, not with the page: most who open a job
// only read it.
type UploadFiles = ReturnType<typeof generateReactHelpers<PhotoRouter>>["uploadFiles"];
let uploader: Promise<UploadFiles> | null = null;
function loadUploader(): Promise<UploadFiles> {
  uploader ??= import("@uploadthing/react").then(
    (m) => m.generateReactHelpers<PhotoRouter>().uploadFiles,
    (error: unknown) => {
      // A failed load (the signal dropped) is tried again on the next send, not kept.
      uploader = null;
      throw error;
    },
  );
  return uploader;
}

const photoKeys = { job: (jobId: number) => ["job", jobId, "photos"] as const, line: (jobId: number) => ["job", jobId, "photos", "line"] as const };

type LineEntry = { name: string; state: "waiting" | "decoding"; ahead: number };

/** What a photo that reached the server is doing: the server checks and resizes one photo at a time. */
function checkingWords(entry: LineEntry | undefined) {
  if (!entry || entry.state === "decoding") return "Checking and saving…";
  return `In line: ${entry.ahead} ${entry.ahead === 1 ? "photo" : "photos"} ahead`;
}

type Sending = { id: string; name: string; bytes: number; progress: number; state: "uploading" | "checking" | "saved" | "refused" | "failed"; reason?: string };

function mb(bytes: number) {
  return bytes < 1048576 ? `${Math.max(1, Math.round(bytes / 1024))} kB` : `${(bytes / 1048576).toFixed(1)} MB`;
}

/** Refusals the phone can make before anything is sent; the server checks again, by the bytes. */
function refuseEarly(file: File): string | null {
  if (/heic|heif/i.test(file.type) || /\.(heic|heif)$/i.test(file.name)) return "HEIC photos cannot be read here: set the camera to JPEG (most compatible), or use Take photo.";
  if (!(PHOTO_TYPES as readonly string[]).includes(file.type)) return "Not a JPEG, PNG or WebP photo.";
  if (file.size > MAX_PHOTO_BYTES) return `${mb(file.size)}: over the 8 MB limit.`;
  return null;
}

export function PhotosPanel({
  jobId,
  jobStage,
  stages,
  parts,
  role,
  initialPhotos,
  timeZone,
}: {
  jobId: number;
  jobStage: Stage;
  stages: Stage[];
  parts: { id: number; name: string }[];
  role: Role;
  initialPhotos: JobPhoto[];
  /** The shop's zone: a photo's time reads as the shop's clock showed it, on the server and in the browser alike. */
  timeZone: string;
}) {
  const queryClient = useQueryClient();
  const photos = useQuery({ queryKey: photoKeys.job(jobId), queryFn: () => api<{ photos: JobPhoto[] }>(`/api/jobs/${jobId}/photos`).then((r) => r.photos), initialData: initialPhotos });
  // The stage a new photo is filed under follows the job as it moves, unless someone chose another
  // one while the job was where it is now (a photo of the Fabricate weld taken during Install).
  const [chosen, setChosen] = useState<{ stage: Stage; whileJobIn: Stage } | null>(null);
  const stage = chosen && chosen.whileJobIn === jobStage ? chosen.stage : jobStage;
  const setStage = (next: Stage) => setChosen({ stage: next, whileJobIn: jobStage });
  const [partId, setPartId] = useState<string>("");
  const [caption, setCaption] = useState("");
  const [sending, setSending] = useState<Sending[]>([]);
  const [notice, setNotice] = useState<string | null>(null);
  const cameraRef = useRef<HTMLInputElement>(null);
  const pickRef = useRef<HTMLInputElement>(null);
  const ids = useId();
  const busy = sending.some((s) => s.state === "uploading" || s.state === "checking");
  const checking = sending.some((s) => s.state === "checking");
  const line = useQuery({
    queryKey: photoKeys.line(jobId),
    queryFn: () => api<{ line: LineEntry[] }>(`/api/jobs/${jobId}/photos/line`).then((r) => r.line),
    enabled: checking,
    refetchInterval: checking ? 1000 : false,
    staleTime: 0,
  });
  const lineByName = new Map((checking ? (line.data ?? []) : []).map((e) => [e.name, e]));

  function update(id: string, patch: Partial<Sending>) {
    setSending((list) => list.map((s) => (s.id === id ? { ...s, ...patch } : s)));
  }

  async function send(fileList: FileList | null) {
    if (!fileList || fileList.length === 0) return;
    setNotice(null);
    const files = [...fileList];
    if (files.length > MAX_PHOTOS_PER_UPLOAD) {
      setNotice(`Choose at most ${MAX_PHOTOS_PER_UPLOAD} photos at a time; you chose ${files.length}.`);
      return;
    }
    const rows: Sending[] = files.map((f, i) => ({ id: `${Date.now()}-${i}`, name: f.name, bytes: f.size, progress: 0, state: "uploading" }));
    const ok: { file: File; row: Sending }[] = [];
    files.forEach((file, i) => {
      const reason = refuseEarly(file);
      if (reason) rows[i] = { ...rows[i], state: "refused", reason };
      else ok.push({ file, row: rows[i] });
    });
    setSending((list) => [...rows, ...list.filter((s) => s.state !== "saved")]);
    if (ok.length === 0) return;
    const rowOf = new Map(ok.map(({ file, row }) => [file, row.id]));
    try {
      const uploadFiles = await loadUploader();
      const results = await uploadFiles("jobPhoto", {
        files: ok.map((o) => o.file),
        input: { jobId, stage, partId: partId ? Number(partId) : null, caption },
        onUploadProgress: ({ file, progress }) => {
          const id = rowOf.get(file);
          if (id) update(id, { progress, state: progress >= 100 ? "checking" : "uploading" });
        },
      });
      results.forEach((result, i) => {
        const id = ok[i].row.id;
        const data = result.serverData as { photoId: number } | { refused: string } | { failed: string } | null;
        if (data && "refused" in data) update(id, { state: "refused", reason: data.refused.replace(/^[^:]*: /, "") });
        else if (data && "failed" in data) update(id, { state: "failed", reason: data.failed.replace(/^[^:]*: /, "") });
        else update(id, { state: "saved", progress: 100 });
      });
      setCaption("");
    } catch (err) {
      const reason = err instanceof Error ? err.message : "The upload did not finish.";
      for (const { row } of ok) update(row.id, { state: "failed", reason });
    } finally {
      await queryClient.invalidateQueries({ queryKey: photoKeys.job(jobId) });
      if (cameraRef.current) cameraRef.current.value = "";
      if (pickRef.current) pickRef.current.value = "";
    }
  }

  return (
    <div className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="block text-sm font-semibold" htmlFor={`${ids}-stage`}>
          Stage the photo shows
          <select id={`${ids}-stage`} value={stage} onChange={(e) => setStage(e.target.value as Stage)} className={`${inputClass} mt-1`}>
            {stages.map((s) => (
              <option key={s} value={s}>
                {STAGE_LABELS[s]}
                {s === jobStage ? " (now)" : ""}
              </option>
            ))}
          </select>
        </label>
        {parts.length > 0 && (
          <label className="block text-sm font-semibold" htmlFor={`${ids}-part`}>
            Part (optional)
            <select id={`${ids}-part`} value={partId} onChange={(e) => setPartId(e.target.value)} className={`${inputClass} mt-1`}>
              <option value="">The job as a whole</option>
              {parts.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </select>
          </label>
        )}
        <label className="block text-sm font-semibold sm:col-span-2" htmlFor={`${ids}-caption`}>
          Caption (optional)
          <input id={`${ids}-caption`} value={caption} onChange={(e) => setCaption(e.target.value)} maxLength={300} placeholder="What the photo shows, e.g. sump weld before leak test" className={`${inputClass} mt-1`} />
        </label>
      </div>

      <div className="flex flex-wrap gap-2">
        <label className={`${buttonClass.primary} cursor-pointer focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-spark-500 ${busy ? "pointer-events-none opacity-60" : ""}`}>
          <span aria-hidden="true">◉</span> Take photo
          <input ref={cameraRef} type="file" accept="image/*" capture="environment" className="sr-only" disabled={busy} onChange={(e) => send(e.target.files)} data-testid="photo-camera" />
        </label>
        <label className={`${buttonClass.secondary} cursor-pointer focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-spark-500 ${busy ? "pointer-events-none opacity-60" : ""}`}>
          <span aria-hidden="true">+</span> Choose photos
          <input ref={pickRef} type="file" accept="image/jpeg,image/png,image/webp" multiple className="sr-only" disabled={busy} onChange={(e) => send(e.target.files)} data-testid="photo-pick" />
        </label>
      </div>
      <p className="text-sm text-ink-soft">JPEG, PNG or WebP, up to 8 MB each and 10 at a time. New photos are for staff until you mark them for the customer.</p>
      {notice && (
        <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          ⚠ {notice}
        </p>
      )}

      {sending.length > 0 && (
        <ul className="space-y-2" aria-live="polite" aria-label="Photos being sent">
          {sending.map((s) => (
            <li key={s.id} className="rounded-md border border-line p-2 text-sm">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <span className="min-w-0 truncate font-semibold">{s.name}</span>
                <span className="text-ink-soft">{mb(s.bytes)}</span>
              </div>
              {(s.state === "uploading" || s.state === "checking") && (
                <div className="mt-1 flex items-center gap-2">
                  <div className="h-2 flex-1 overflow-hidden rounded-full bg-bay-50" role="progressbar" aria-label={`Upload of ${s.name}`} aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(s.progress)}>
                    <div className="h-full bg-bay-600 transition-[width]" style={{ width: `${s.progress}%` }} />
                  </div>
                  <span className="w-48 text-right" data-testid="photo-progress">
                    {s.state === "checking" ? checkingWords(lineByName.get(s.name)) : `Uploading ${Math.round(s.progress)} %`}
                  </span>
                </div>
              )}
              {s.state === "saved" && <p className="mt-1 font-medium text-ok-700">✓ Saved</p>}
              {(s.state === "refused" || s.state === "failed") && (
                <p className="mt-1 font-medium text-stop-700">
                  ⚠ {s.state === "refused" ? "Refused" : "Not sent"}: {s.reason}
                </p>
              )}
            </li>
          ))}
        </ul>
      )}

      {photos.data.length === 0 ? (
        <p className="text-ink-soft">No photos yet. Photos prove the work to the customer: the tank before coating, the pump on the PTO, the finished install.</p>
      ) : (
        <ul className="grid grid-cols-1 gap-3 sm:grid-cols-2 xl:grid-cols-3">
          {photos.data.map((photo) => (
            <PhotoCard key={photo.id} photo={photo} jobId={jobId} stages={stages} timeZone={timeZone} canDelete={role === "office" || role === "owner"} />
          ))}
        </ul>
      )}
    </div>
  );
}

function PhotoCard({ photo, jobId, stages, timeZone, canDelete }: { photo: JobPhoto; jobId: number; stages: Stage[]; timeZone: string; canDelete: boolean }) {
  const queryClient = useQueryClient();
  const key = photoKeys.job(jobId);
  const [caption, setCaption] = useState(photo.caption);
  const [error, setError] = useState<string | null>(null);
  const ids = useId();

  const patch = useMutation({
    mutationFn: (body: { caption?: string; customerVisible?: boolean; stage?: Stage }) => api<{ photo: JobPhoto }>(`/api/photos/${photo.id}`, { method: "PATCH", body }),
    onMutate: async (body) => {
      setError(null);
      await queryClient.cancelQueries({ queryKey: key });
      const before = queryClient.getQueryData<JobPhoto[]>(key);
      queryClient.setQueryData<JobPhoto[]>(key, (list) => list?.map((p) => (p.id === photo.id ? { ...p, ...body } : p)));
      return { before };
    },
    onError: (err, _body, context) => {
      if (context?.before) queryClient.setQueryData(key, context.before);
      setError(err instanceof ApiRequestError ? err.message : "Not saved; try again.");
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey: key }),
  });
  const remove = useMutation({
    mutationFn: () => api(`/api/photos/${photo.id}`, { method: "DELETE" }),
    onError: (err) => setError(err instanceof ApiRequestError ? err.message : "Not deleted; try again."),
    onSettled: () => queryClient.invalidateQueries({ queryKey: key }),
  });

  const label = photo.caption || `Photo ${photo.partName ? `of ${photo.partName} ` : ""}at ${STAGE_LABELS[photo.stage]}`;
  return (
    <li className="overflow-hidden rounded-md border border-line bg-panel" data-testid="photo-card">
      <a href={`/api/photos/${photo.id}`} target="_blank" rel="noreferrer" className="block bg-bay-50">
        <img src={`/api/photos/${photo.id}?size=thumb`} alt={label} width={photo.width} height={photo.height} loading="lazy" className="aspect-[4/3] h-auto w-full object-cover" />
      </a>
      <div className="space-y-2 p-2">
        {photo.partName && (
          <p className="text-sm font-semibold" data-testid="photo-part">
            <span className="font-normal text-ink-soft">Part:</span> {photo.partName}
          </p>
        )}
        <p className="text-sm text-ink-soft">
          {STAGE_LABELS[photo.stage]} · {photo.uploadedBy?.split(" ")[0] ?? "staff"} · <time dateTime={photo.createdAt}>{formatShopTime(photo.createdAt, timeZone, "d MMM, HH:mm")}</time>
        </p>
        <button
          type="button"
          aria-pressed={photo.customerVisible}
          onClick={() => patch.mutate({ customerVisible: !photo.customerVisible })}
          className={`flex min-h-11 w-full items-center justify-center gap-2 rounded-md border px-3 py-2 text-sm font-semibold ${photo.customerVisible ? "border-ok-700 bg-ok-100 text-ok-700" : "border-line bg-panel text-ink"}`}
        >
          {photo.customerVisible ? "✓ Customer sees this" : "Staff only: show to customer"}
        </button>
        <form
          className="flex gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            patch.mutate({ caption });
          }}
        >
          <label htmlFor={`${ids}-cap`} className="sr-only">
            Caption
          </label>
          <input id={`${ids}-cap`} value={caption} onChange={(e) => setCaption(e.target.value)} maxLength={300} placeholder="Add a caption" className={`${inputClass} min-w-0 flex-1`} />
          <button type="submit" className={buttonClass.secondary} disabled={caption === photo.caption || patch.isPending}>
            Save
          </button>
        </form>
        <div className="flex flex-wrap items-center gap-2">
          <label htmlFor={`${ids}-stage`} className="sr-only">
            Stage
          </label>
          <select id={`${ids}-stage`} value={photo.stage} onChange={(e) => patch.mutate({ stage: e.target.value as Stage })} className={`${inputClass} min-w-0 flex-1`}>
            {stages.map((s) => (
              <option key={s} value={s}>
                {STAGE_LABELS[s]}
              </option>
            ))}
          </select>
          {canDelete && (
            <button
              type="button"
              className={buttonClass.danger}
              disabled={remove.isPending}
              onClick={() => {
                if (window.confirm("Delete this photo for good? The customer will not see it either.")) remove.mutate();
              }}
            >
              Delete
            </button>
          )}
        </div>
        {error && (
          <p role="alert" className="text-sm font-medium text-stop-700">
            ⚠ {error}
          </p>
        )}
      </div>
    </li>
  );
}
