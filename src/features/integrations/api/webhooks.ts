import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import {
  webhookDeliveryDetailSchema,
  webhookDeliveryPageSchema,
  webhookDeliverySchema,
  webhookEndpointCreatedSchema,
  webhookEndpointListResponseSchema,
  webhookEndpointPatchSchema,
  webhookEndpointSchema,
  webhookReceiptListResponseSchema,
  type WebhookEndpointBody,
} from '../../../../shared/contracts/integrations';
import { okSchema } from '../../../../shared/contracts/common';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** Keys: ['webhooks'] (all), ['webhooks', 'endpoints'], ['webhooks', 'deliveries', page], ['webhooks', 'delivery', id], ['webhooks', 'receipts']. */
export const webhooksKeys = {
  all: ['webhooks'] as const,
  endpoints: () => [...webhooksKeys.all, 'endpoints'] as const,
  deliveries: (page: number) => [...webhooksKeys.all, 'deliveries', page] as const,
  delivery: (id: string) => [...webhooksKeys.all, 'delivery', id] as const,
  receipts: () => [...webhooksKeys.all, 'receipts'] as const,
};

/** GET /api/webhooks/endpoints (admin). */
export async function listEndpoints(signal?: AbortSignal) {
  return (await apiRequest('/api/webhooks/endpoints', { schema: webhookEndpointListResponseSchema, signal })).items;
}
export const endpointsQueryOptions = () => queryOptions({ queryKey: webhooksKeys.endpoints(), queryFn: ({ signal }) => listEndpoints(signal) });

export function useEndpoints() {
  return useQuery({ ...endpointsQueryOptions(), refetchInterval: 5_000 });
}

/** POST /api/webhooks/endpoints (admin): the endpoint with its signing secret (shown this once). */
export async function createEndpoint(body: WebhookEndpointBody) {
  return apiRequest('/api/webhooks/endpoints', { method: 'POST', body, schema: webhookEndpointCreatedSchema });
}
export function useCreateEndpoint() {
  return useInvalidatingMutation(createEndpoint, [webhooksKeys.all], { after: 'success' });
}

/** PATCH /api/webhooks/endpoints/:id (admin). */
export async function updateEndpoint({ id, ...patch }: { id: string } & z.input<typeof webhookEndpointPatchSchema>) {
  return apiRequest(`/api/webhooks/endpoints/${encodeURIComponent(id)}`, { method: 'PATCH', body: patch, schema: webhookEndpointSchema });
}
export function useUpdateEndpoint() {
  return useInvalidatingMutation(updateEndpoint, [webhooksKeys.all]);
}

/** DELETE /api/webhooks/endpoints/:id (admin). */
export async function deleteEndpoint(id: string) {
  return apiRequest(`/api/webhooks/endpoints/${encodeURIComponent(id)}`, { method: 'DELETE', schema: okSchema });
}
export function useDeleteEndpoint() {
  return useInvalidatingMutation(deleteEndpoint, [webhooksKeys.all]);
}

/** POST /api/webhooks/endpoints/:id/secret (admin): a new signing secret. */
export async function rotateSecret(id: string) {
  return apiRequest(`/api/webhooks/endpoints/${encodeURIComponent(id)}/secret`, { method: 'POST', schema: webhookEndpointCreatedSchema });
}
export function useRotateSecret() {
  return useInvalidatingMutation(rotateSecret, [webhooksKeys.all], { after: 'success' });
}

/** GET /api/webhooks/deliveries (admin): newest first. */
export async function listDeliveries(page: number, signal?: AbortSignal) {
  return apiRequest('/api/webhooks/deliveries', { query: { page, pageSize: 25 }, schema: webhookDeliveryPageSchema, signal });
}
export const deliveriesQueryOptions = (page: number) => queryOptions({ queryKey: webhooksKeys.deliveries(page), queryFn: ({ signal }) => listDeliveries(page, signal) });

export function useDeliveries(page: number) {
  return useQuery({ ...deliveriesQueryOptions(page), refetchInterval: 3_000 });
}

/** GET /api/webhooks/deliveries/:id (admin): the body sent and every attempt. */
export async function getDelivery(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/webhooks/deliveries/${encodeURIComponent(id)}`, { schema: webhookDeliveryDetailSchema, signal });
}
export const deliveryQueryOptions = (id: string) => queryOptions({ queryKey: webhooksKeys.delivery(id), queryFn: ({ signal }) => getDelivery(id, signal) });

/** While the drawer is open it reads again every 3 s: a "Send again now" is answered before its attempt is made. */
export function useDelivery(id: string | null) {
  return useQuery({ ...deliveryQueryOptions(id ?? ''), enabled: id !== null, refetchInterval: 3_000 });
}

/** POST /api/webhooks/deliveries/:id/resend (admin). */
export async function resendDelivery(id: string) {
  return apiRequest(`/api/webhooks/deliveries/${encodeURIComponent(id)}/resend`, { method: 'POST', schema: webhookDeliverySchema });
}
export function useResendDelivery() {
  return useInvalidatingMutation(resendDelivery, [webhooksKeys.all]);
}

/** GET /api/webhooks/local-receiver (admin): what the local receiver caught. */
export async function listReceipts(signal?: AbortSignal) {
  return (await apiRequest('/api/webhooks/local-receiver', { schema: webhookReceiptListResponseSchema, signal })).items;
}
export const receiptsQueryOptions = () => queryOptions({ queryKey: webhooksKeys.receipts(), queryFn: ({ signal }) => listReceipts(signal) });

export function useReceipts() {
  return useQuery({ ...receiptsQueryOptions(), refetchInterval: 3_000, retry: false });
}
