// The integrations area's public face: API keys, webhooks (outbox, sender, local receiver)
// and the published-content feed.
export { registerFeedRoutes, registerIntegrationRoutes } from './routes';
export { createWebhookSender, emitEvent, type WebhookSender, type WebhookSenderOptions } from './outbox';
export { sign, verifySignature, signatureHeader, timestampHeader } from './signing';
export { localReceiverPath } from './receiver';
export { seedDemoWebhooks } from './demo-seed';
