import { z } from 'zod';
import { eventTypeSchema, type EventType } from '../../../shared/contracts/integrations';
import { parseStoredJson } from '../../platform/db/stored-json';

// The integrations area's stored JSON, read through the schema that wrote it.

const endpointEventsSchema = z.array(eventTypeSchema);

export function parseEndpointEvents(row: { id: string; eventsJson: string }): EventType[] {
  return parseStoredJson(endpointEventsSchema, row.eventsJson, { table: 'webhook_endpoint', rowId: row.id, column: 'events_json' });
}
