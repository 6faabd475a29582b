import type { z } from 'zod';
import type { proofLineSchema, proofPositionSchema } from '../../../../shared/schemas/run.schema';

/** The fields of a delivery record, as sent in JSON or as the multipart `data` field. */
export interface DeliveryRecordFields {
  receiver_name: string;
  note: string;
  /** ISO-8601 UTC: when the driver pressed "Delivered", not when the signal came back. */
  delivered_at: string;
  /** Left out when the phone did not give it. */
  position?: z.output<typeof proofPositionSchema>;
  lines: z.output<typeof proofLineSchema>[];
}

export interface QueuedPhoto {
  blob: Blob;
  name: string;
  type: string;
}

/** Where a queued write stands: waiting for the signal (tried again by itself) or refused by the server. */
export type QueuedState = 'waiting' | 'refused';

interface QueuedBase {
  /** The Idempotency-Key made on the phone when the record was made; every try sends the same one. */
  key: string;
  queued_at: string;
  attempts: number;
  state: QueuedState;
  last_error: string | null;
}

export interface QueuedDelivery extends QueuedBase {
  kind: 'delivery';
  order_id: number;
  reference: string;
  site_name: string;
  data: DeliveryRecordFields;
  /** The receiver's signature as a PNG, or null when they confirmed by typing their name. */
  signature: Blob | null;
  photos: QueuedPhoto[];
}

export interface QueuedCautionsRead extends QueuedBase {
  kind: 'cautions_read';
  run_id: number;
  /** "07:30-12:00 on RL-TY01", for the list of what is waiting. */
  run_label: string;
  read_at: string;
}

export type QueuedEntry = QueuedDelivery | QueuedCautionsRead;

/** What one send came to. */
export type SendOutcome = 'sent' | 'already_recorded' | 'offline' | 'retry_later' | 'refused' | 'signed_out';
