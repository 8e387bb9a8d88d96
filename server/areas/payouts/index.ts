// The payouts area's public face: the money routes (payouts, earnings, the provider's
// webhook), the demo seeder, the payments provider from the environment, its local fake,
// and the editions' FeeRecorder (wired in server/compose.ts).
export { registerMoneyRoutes } from './routes';
export { seedDemoPayouts } from './demo-seed';
export { localPaymentsFake, paymentsProviderFromEnv } from './runtime';
export { feeRecorder } from './ledger';
