/**
 * Who may use what: every route handler method, page and server action in `app/`, for each kind
 * of visitor. `access-matrix.test.ts` walks `app/` and fails for anything this table does not
 * list (it prints the row to paste), then calls each one as each visitor and compares.
 *
 * Visitors: `none` (no cookie), `statusLink` (a customer holding a live status link: on
 * `/status/[token]` routes the link is in the URL; elsewhere it is tried as a session cookie),
 * `tech`, `office`, `owner`, `deactivated` (a staff member turned off while still holding a
 * signed-in device).
 *
 * Outcomes
 * - route handlers: `"ok"` (reached its work: any answer but 401/403, never 500), or the refusal
 *   status `401` / `403` / `404` (404 where a wrong link must look like no link at all);
 * - pages: `"ok"` (renders), `"404"`, or `"→/path"` (redirects there);
 * - server actions: `"ok"`, `"refused"` (answers with a message and changes nothing), `"→/path"`.
 *
 * Requests carry an empty JSON body and ids of rows that exist, so "ok" means access was granted,
 * not that the write succeeded.
 */
export const WHO = ["none", "statusLink", "tech", "office", "owner", "deactivated"] as const;
export type Who = (typeof WHO)[number];
export type Outcome = "ok" | 401 | 403 | 404 | "404" | "refused" | `→/${string}`;
export type Row = { key: string } & Record<Who, Outcome>;

const row = (key: string, none: Outcome, statusLink: Outcome, tech: Outcome, office: Outcome, owner: Outcome, deactivated: Outcome): Row => ({
  key,
  none,
  statusLink,
  tech,
  office,
  owner,
  deactivated,
});

// Shorthands for the common shapes.
const anyStaff = (key: string) => row(key, 401, 401, "ok", "ok", "ok", 401);
const officeUp = (key: string) => row(key, 401, 401, 403, "ok", "ok", 401);
const ownerOnly = (key: string) => row(key, 401, 401, 403, 403, "ok", 401);
const open = (key: string) => row(key, "ok", "ok", "ok", "ok", "ok", "ok");
const staffPage = (key: string) => row(key, "→/sign-in", "→/sign-in", "ok", "ok", "ok", "→/sign-in");
const officePage = (key: string) => row(key, "→/sign-in", "→/sign-in", "→/board?denied=1", "ok", "ok", "→/sign-in");
const ownerPage = (key: string) => row(key, "→/sign-in", "→/sign-in", "→/board?denied=1", "→/board?denied=1", "ok", "→/sign-in");

export const ACCESS_MATRIX: Row[] = [
  // Open to everyone: health, signing in and out.
  open("GET /api/health"),
  open("POST /api/session"),
  open("DELETE /api/session"),
  // The payment service's webhook: no session; its signature is the key (refused with 400 without one).
  open("POST /api/payments/webhook"),
  // The customer's status link: the link in the URL is the key, and a wrong one looks like no link.
  row("PAGE /status/[token]", "404", "ok", "404", "404", "404", "404"),
  row("GET /status/[token]/photos/[photoId]", 404, "ok", 404, 404, 404, 404),
  row("POST /status/[token]/quote", 404, "ok", 404, 404, 404, 404),
  row("GET /status/[token]/quote/[quoteId]/pdf", 404, "ok", 404, 404, 404, 404),
  row("POST /status/[token]/checkout", 404, "ok", 404, 404, 404, 404),
  // Signing in and first run (first run answers only while no one works here).
  // The overview is the office's and owner's first page; the bench starts at the board.
  row("PAGE /", "→/sign-in", "→/sign-in", "→/board", "ok", "ok", "→/sign-in"),
  row("PAGE /sign-in", "ok", "ok", "→/", "→/", "→/", "ok"),
  row("PAGE /first-run", "→/sign-in", "→/sign-in", "→/sign-in", "→/sign-in", "→/sign-in", "→/sign-in"),
  row("ACTION app/(auth)/first-run/actions.ts#createOwnerAction", "refused", "refused", "refused", "refused", "refused", "refused"),

  // Pages.
  staffPage("PAGE /board"),
  officePage("PAGE /reports"),
  staffPage("PAGE /calculator"),
  staffPage("PAGE /coating"),
  officePage("PAGE /parts"),
  officePage("PAGE /purchase-orders/[id]"),
  officePage("PAGE /job-costs"),
  staffPage("PAGE /customers"),
  staffPage("PAGE /customers/[id]"),
  officePage("PAGE /customers/new"),
  staffPage("PAGE /jobs"),
  staffPage("PAGE /jobs/[id]"),
  staffPage("PAGE /jobs/[id]/sheet"),
  officePage("PAGE /jobs/new"),
  ownerPage("PAGE /staff"),
  ownerPage("PAGE /audit"),
  staffPage("PAGE /account"),
  // The office reads the shop's settings (and saves customer e-mail, as on a job); the owner changes the rest.
  officePage("PAGE /settings"),
  officePage("PAGE /prices"),
  staffPage("PAGE /trucks"),
  staffPage("PAGE /trucks/[id]"),
  officePage("PAGE /trucks/new"),

  // The signed-in staff member.
  anyStaff("GET /api/me"),
  anyStaff("POST /api/me/password"),
  anyStaff("GET /api/me/devices"),
  anyStaff("DELETE /api/me/devices"),
  // Another person's device is not found from here (see account.test.ts); an unknown id is 404 too.
  row("DELETE /api/me/devices/[id]", 401, 401, "ok", "ok", "ok", 401),
  anyStaff("GET /api/ping"),

  // Board and jobs: a tech moves cards and edits a job's notes; office and owner create and plan.
  anyStaff("GET /api/board"),
  // The office's desk: overview and reports.
  officeUp("GET /api/overview"),
  anyStaff("GET /api/search"),
  officeUp("GET /api/reports/stage-times"),
  officeUp("GET /api/reports/throughput"),
  officeUp("GET /api/reports/coaters"),
  officeUp("GET /api/reports/workload"),
  anyStaff("GET /api/jobs"),
  officeUp("POST /api/jobs"),
  officeUp("GET /api/jobs/export.csv"),
  anyStaff("GET /api/jobs/[id]"),
  anyStaff("PATCH /api/jobs/[id]"),
  anyStaff("POST /api/jobs/[id]/moves"),
  anyStaff("POST /api/jobs/[id]/undo"),
  anyStaff("GET /api/jobs/[id]/kit-spec"),
  officeUp("PUT /api/jobs/[id]/kit-spec"),
  anyStaff("POST /api/kit-calc"),

  // Customers and trucks.
  anyStaff("GET /api/customers"),
  officeUp("POST /api/customers"),
  anyStaff("GET /api/customers/[id]"),
  officeUp("PATCH /api/customers/[id]"),
  anyStaff("GET /api/trucks"),
  officeUp("POST /api/trucks"),
  anyStaff("GET /api/trucks/[id]"),
  officeUp("PATCH /api/trucks/[id]"),

  // Records: any staff records work; office and owner delete parts, add coaters and send runs.
  anyStaff("GET /api/jobs/[id]/parts"),
  anyStaff("POST /api/jobs/[id]/parts"),
  anyStaff("GET /api/parts/[id]"),
  anyStaff("PATCH /api/parts/[id]"),
  officeUp("DELETE /api/parts/[id]"),
  // Bought-in parts: any staff lists and receives them and marks them installed (costs are checked
  // inside: a tech's cost is refused); office and owner remove lines and make purchase orders.
  anyStaff("GET /api/jobs/[id]/bought-parts"),
  anyStaff("POST /api/jobs/[id]/bought-parts"),
  anyStaff("POST /api/jobs/[id]/bought-parts/from-kit-spec"),
  anyStaff("POST /api/jobs/[id]/bought-parts/from-quote"),
  anyStaff("GET /api/bought-parts/[id]"),
  anyStaff("PATCH /api/bought-parts/[id]"),
  officeUp("DELETE /api/bought-parts/[id]"),
  anyStaff("POST /api/bought-parts/[id]/receipts"),
  officeUp("POST /api/purchase-orders"),
  officeUp("GET /api/parts-desk"),
  // The labour clock: each person clocks themselves on and off; the office and owner correct entries.
  anyStaff("GET /api/clock"),
  anyStaff("POST /api/clock"),
  anyStaff("DELETE /api/clock"),
  officeUp("PATCH /api/clock-entries/[id]"),
  officeUp("GET /api/shop-settings/labour-rate"),
  officeUp("GET /api/reports/job-costs"),
  ownerOnly("PATCH /api/shop-settings/labour-rate"),
  officeUp("GET /api/purchase-orders/[id]"),
  officeUp("PATCH /api/purchase-orders/[id]"),
  anyStaff("GET /api/parts/[id]/leak-tests"),
  anyStaff("POST /api/parts/[id]/leak-tests"),
  anyStaff("GET /api/jobs/[id]/sign-off"),
  anyStaff("PUT /api/jobs/[id]/sign-off"),
  anyStaff("GET /api/coating-runs"),
  officeUp("GET /api/coating-runs/export.csv"),
  officeUp("POST /api/coating-runs"),
  anyStaff("GET /api/coating-runs/[id]"),
  anyStaff("PATCH /api/coating-runs/[id]"),
  anyStaff("GET /api/vendors"),
  officeUp("POST /api/vendors"),

  // Photos: any staff uploads and captions; office and owner delete.
  anyStaff("GET /api/uploadthing"),
  anyStaff("POST /api/uploadthing"),
  anyStaff("GET /api/jobs/[id]/photos"),
  anyStaff("GET /api/jobs/[id]/photos/line"),
  anyStaff("GET /api/photos/[id]"),
  anyStaff("PATCH /api/photos/[id]"),
  officeUp("DELETE /api/photos/[id]"),

  // Customer e-mail and status links: office and owner.
  anyStaff("GET /api/jobs/[id]/email-settings"),
  officeUp("PUT /api/jobs/[id]/email-settings"),
  anyStaff("GET /api/jobs/[id]/messages"),
  officeUp("POST /api/messages/[id]/resend"),
  officeUp("POST /api/messages/[id]/send-now"),
  anyStaff("GET /api/notify-settings"),
  officeUp("PUT /api/notify-settings"),
  anyStaff("GET /api/jobs/[id]/status-links"),
  officeUp("POST /api/jobs/[id]/status-links"),
  officeUp("DELETE /api/status-links/[id]"),

  // Staff and shop settings: the owner.
  ownerOnly("GET /api/staff"),
  ownerOnly("GET /api/audit"),
  ownerOnly("POST /api/staff"),
  ownerOnly("PATCH /api/staff/[id]"),
  ownerOnly("POST /api/staff/[id]/password-reset"),
  anyStaff("GET /api/shop-settings"),
  ownerOnly("PATCH /api/shop-settings"),
  anyStaff("GET /api/shop-settings/leak-test-procedure"),
  officeUp("GET /api/shop-settings/shop"),
  ownerOnly("PUT /api/shop-settings/shop"),
  ownerOnly("PATCH /api/shop-settings/leak-test-procedure"),

  // Money: the office prices and sends quotes; the owner keeps the price list, tax rate and deposit.
  officeUp("GET /api/price-items"),
  ownerOnly("POST /api/price-items"),
  ownerOnly("PATCH /api/price-items/[id]"),
  officeUp("GET /api/shop-settings/money"),
  ownerOnly("PUT /api/shop-settings/money"),
  // Money checks before work and delivery: the owner's setting.
  ownerOnly("PUT /api/shop-settings/money-checks"),
  officeUp("GET /api/jobs/[id]/quotes"),
  officeUp("POST /api/jobs/[id]/quotes"),
  officeUp("GET /api/jobs/[id]/quotes/kit-lines"),
  officeUp("GET /api/quotes/[id]"),
  officeUp("PUT /api/quotes/[id]"),
  officeUp("POST /api/quotes/[id]/send"),
  officeUp("GET /api/quotes/[id]/pdf"),
  // Payments taken at the counter and invoices: office and owner (on account is the owner's, inside);
  // voiding an invoice is the owner's.
  officeUp("POST /api/jobs/[id]/payments"),
  officeUp("POST /api/jobs/[id]/invoice"),
  ownerOnly("POST /api/invoices/[id]/void"),
];
