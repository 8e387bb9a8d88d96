import { answerApiRequest, apiRoutes, unrecognized } from './api';
import { createFakeContext } from './context';
import { controlAnswer, fakeControls } from './controls';
import { closeServer, createFakeHttpServer, listenOnLoopback, type FakeRequest } from './http-server';
import { createSettlement } from './money';
import { onboardingPage } from './onboarding-page';
import { FAKE_SECRET_KEY, type PaymentsFake, type PaymentsFakeOptions } from './types';

// A local stand-in for the payments provider, so development, the demo and the tests run
// without network or a real key. It answers the few endpoints our SDK calls the way the
// provider's API does (form-encoded bodies, objects with ids, the error envelope,
// Idempotency-Key replays), simulates the provider's hosted onboarding page, settles
// payouts a moment later and reports the result with a signed webhook, like the real
// thing. Failures on demand: flag an account so its transfers are refused or its payouts
// fail, or make the next call to a path answer 500.
//
// The parts: ./state.ts (the objects and their file), ./api.ts (the /v1 API),
// ./accounts.ts and ./onboarding-page.ts (accounts, the hosted page), ./money.ts
// (transfers, payouts, settling), ./webhooks.ts (signed events), ./controls.ts (the
// switches), ./http-server.ts (the HTTP plumbing).

export { FAKE_SECRET_KEY, type PaymentsFake, type PaymentsFakeOptions, type PaymentsFakeStats } from './types';
export { parseFormBody } from './params';
export { FakeStateFileError } from './state';

export async function startPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const ctx = createFakeContext(options);
  const settlement = createSettlement(ctx, { delayMs: options.settleDelayMs ?? 300, auto: options.autoSettle ?? true });
  const controls = fakeControls(ctx, settlement);
  let baseUrl = '';
  const routes = apiRoutes(ctx, settlement, () => baseUrl);

  const answer = (req: FakeRequest) => {
    const page = req.path.match(/^\/connect\/onboarding\/(\w+)$/);
    if (page) return onboardingPage(ctx, page[1] ?? '', req.method);
    const control = req.path.startsWith('/__fake/') ? controlAnswer(controls, req.method, req.path) : null;
    if (control) return control;
    if (!req.path.startsWith('/v1/')) throw unrecognized(req.method, req.path);
    return answerApiRequest(ctx, routes, req);
  };
  const server = createFakeHttpServer(answer);
  settlement.resumePending();
  const { port, url } = await listenOnLoopback(server);
  baseUrl = url;

  return {
    host: '127.0.0.1',
    port,
    url,
    secretKey: FAKE_SECRET_KEY,
    ...controls,
    stop: async () => {
      settlement.cancel();
      await ctx.webhooks.settle();
      await closeServer(server);
    },
  };
}
