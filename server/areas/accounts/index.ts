// The accounts area's public face: routes, and the demo accounts other areas' demo seeders
// look up by e-mail.
export { registerAccountRoutes } from './routes';
export { demoAccounts, demoPassword } from './demo-accounts';
