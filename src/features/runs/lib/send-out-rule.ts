import type { Run } from '../../../../shared/schemas/run.schema';
import { formatDay, plural } from './run-format';

export type SendOutBlock = 'sent' | 'nothing_booked' | 'not_today' | 'not_loaded';

export interface SendOutState {
  /** True when the lorry may go: booked, every pallet ticked and the run's day is today. */
  ready: boolean;
  blocks: SendOutBlock[];
  /** One line per block, in words, to show instead of the button. */
  reasons: string[];
  /** Only a day or a missing tick may be overridden; a run already gone or with nothing on it may not. */
  overridable: boolean;
}

type RunForSendOut = Pick<Run, 'date' | 'status' | 'drops' | 'deck'>;

/**
 * Whether a run may be sent out on `today` (the firm's business calendar), and why not. The server
 * applies the same two rules (409 not_today / not_loaded); this is so the screen can say so first.
 */
export function sendOutState(run: RunForSendOut, today: string): SendOutState {
  if (run.status === 'on_the_road' || run.status === 'done') {
    return { ready: false, blocks: ['sent'], reasons: ['This run has been sent out.'], overridable: false };
  }
  if (run.drops.length === 0) {
    return { ready: false, blocks: ['nothing_booked'], reasons: ['Nothing is booked on this run.'], overridable: false };
  }
  const blocks: SendOutBlock[] = [];
  const reasons: string[] = [];
  if (run.date !== today) {
    blocks.push('not_today');
    reasons.push(
      run.date > today ? `Not before its day: this run is for ${formatDay(run.date)} and today is ${formatDay(today)}.` : `Its day has passed: this run was for ${formatDay(run.date)} and today is ${formatDay(today)}.`,
    );
  }
  const positions = run.deck.positions;
  const notLoaded = positions.filter((p) => !p.loaded).length;
  if (notLoaded > 0) {
    blocks.push('not_loaded');
    reasons.push(`${plural(notLoaded, 'pallet')} of ${positions.length} ${notLoaded === 1 ? 'is' : 'are'} not ticked loaded yet.`);
  }
  return { ready: blocks.length === 0, blocks, reasons, overridable: blocks.length > 0 };
}
