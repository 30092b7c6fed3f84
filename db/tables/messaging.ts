import type { ColumnType, Generated } from "kysely";
import type { Stage } from "../schema";

export interface PhotoTable {
  id: Generated<number>;
  job_id: number;
  stage: Stage;
  /** A part of the same job; checked by the app, no foreign key (parts live in another migration). */
  part_id: number | null;
  caption: string;
  customer_visible: number;
  uploaded_by: string;
  /** The file's key at the upload service; unique, so a repeated completion callback records nothing twice. */
  upload_key: string;
  original_name: string;
  /** What the bytes are (by magic number), not what the uploader said. */
  original_type: string;
  original_bytes: number;
  width: number;
  height: number;
  created_at: string;
  updated_at: string;
}

export interface StatusLinkTable {
  id: Generated<number>;
  job_id: number;
  /** SHA-256 (hex) of the token in the link; the token itself is never stored. */
  token_hash: string;
  /** Random; with the secret kept outside the database it derives the token again for a retried e-mail. */
  nonce: string;
  /** null when the e-mail dispatcher issued it. */
  issued_by: string | null;
  created_at: string;
  revoked_at: string | null;
  revoked_by: string | null;
  last_opened_at: string | null;
}

/**
 * The e-mail an outbox row becomes. A retry sends it unchanged unless the job's recipients or its
 * status link changed since; then it is rendered again and its revision goes up by one.
 */
export interface EmailMessageTable {
  outbox_id: string;
  job_id: number;
  from_address: string;
  /** JSON array of addresses. */
  to_addresses: string;
  reply_to: string | null;
  subject: string;
  /** With a placeholder where the status link goes (see server/email/render.ts). */
  html: string;
  text: string;
  status_link_id: number | null;
  /** 0 as first rendered; each re-rendering adds one and sends under a new idempotency key. */
  revision: number;
  provider_id: string | null;
  created_at: string;
}

/** A file an e-mail carries (migration 0016): stored with the message so a retry sends the same bytes. */
export interface EmailAttachmentTable {
  outbox_id: string;
  position: number;
  filename: string;
  content_type: string;
  content: Buffer;
}

export interface JobEmailSettingTable {
  job_id: number;
  email_off: number;
  /** 0: the customer's contacts that receive e-mail; 1: exactly the contacts in job_email_recipient. */
  recipients_chosen: number;
  updated_at: string;
  updated_by: string | null;
}

export interface JobEmailRecipientTable {
  job_id: number;
  contact_id: number;
}

export interface MessageSettingTable {
  id: number;
  /** Comma-separated stages whose arrival e-mails the customer. */
  notify_stages: string;
  /** How long a status link keeps working after the truck is delivered. */
  status_link_days: number;
  /** How long a stage e-mail waits after the move, so further moves can replace it (migration 0006). */
  quiet_seconds: ColumnType<number, number | undefined, number>;
  updated_at: string;
  updated_by: string | null;
}

/** Tables of photos, customer e-mail and status links. Filled by migration 0005. */
export interface MessagingTables {
  photo: PhotoTable;
  status_link: StatusLinkTable;
  email_message: EmailMessageTable;
  email_attachment: EmailAttachmentTable;
  job_email_setting: JobEmailSettingTable;
  job_email_recipient: JobEmailRecipientTable;
  message_setting: MessageSettingTable;
}
