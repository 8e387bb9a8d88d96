// Mailbox (local): the admin's view of the mail the local fake SMTP server caught.
export { registerMailboxRoutes } from './routes';
