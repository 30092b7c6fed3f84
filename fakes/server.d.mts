export interface FakesOptions {
  /** 0 picks a free port. Default 4010. */
  port?: number;
  /** Default 127.0.0.1. */
  host?: string;
  /** Where sent messages and uploaded files are kept. Default `.fakes-data`. */
  dataDir?: string;
  /** An UPLOADTHING_TOKEN whose api key the fake may check presigned URLs with. Default: env UPLOADTHING_TOKEN. */
  token?: string;
  /** How long a PUT waits for the app's `/callback-result`. Default 30 000 ms. */
  callbackTimeoutMs?: number;
  /** How long a route-handler upload waits for its `/route-metadata`. Default 5 000 ms. */
  registrationWaitMs?: number;
  /** Where the payments fake POSTs its signed webhook events. Default: env PAYMENTS_WEBHOOK_URL. */
  paymentsWebhookUrl?: string;
  /** The webhook signing secret (`whsec_…`). Default: env PAYMENTS_WEBHOOK_SECRET, else `whsec_local_fake`. */
  paymentsWebhookSecret?: string;
  /** One line per request and event; silent by default. */
  log?: (line: string) => void;
}

export interface Fakes {
  url: string;
  close(): Promise<void>;
}

export declare const LIMITS: Readonly<{
  emailBody: number;
  uploadBody: number;
  jsonBody: number;
  batchSize: number;
  recipients: number;
}>;

export declare function startFakes(options?: FakesOptions): Promise<Fakes>;
export declare function parseUploadthingToken(token: string): { apiKey: string; appId: string };
