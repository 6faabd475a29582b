import type { AppDeps } from './app-deps';
import { createMailWorker, type MailWorker, type MailWorkerOptions } from './mail/outbox-worker';
import { DELIVERY_NOTE_ATTACHMENT, deliveriesService } from './modules/deliveries/deliveries.service';

/**
 * The outbox's worker with the app's attachment renderers (the delivery note, made when its e-mail
 * is sent). Not started: the server starts it unless MAIL_WORKER=off, `npm run worker` runs it alone.
 */
export function createAppMailWorker(deps: AppDeps, options: Partial<MailWorkerOptions> = {}): MailWorker {
  const deliveries = deliveriesService(deps);
  return createMailWorker(deps, options, { [DELIVERY_NOTE_ATTACHMENT]: (ref) => deliveries.deliveryNoteForMail(ref) });
}
