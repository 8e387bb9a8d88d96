import type { EventData, EventType } from '../../shared/contracts/integrations';
import type { DbOrTx } from './db/client';

// Outgoing events (webhooks): the port every area emits through. The implementation lives in
// server/areas/integrations (outbox + signed deliveries) and is wired in server/compose.ts.
//
//   deps.db.transaction((tx) => { ...the change...; deps.events.emit(tx, 'edition.published', {...}); });
//   deps.events.kick();
//
// Like queueMail: the event is written in the same transaction as the change (both or
// neither), and delivered after the commit, with retries, to every endpoint that wants it.

export interface EventSink {
  /** Record the event inside the caller's transaction; throws when `data` does not match the event's schema. */
  emit<T extends EventType>(tx: DbOrTx, type: T, data: EventData<T>): void;
  /** ask the sender to deliver soon (after the transaction commits) */
  kick(): void;
}
