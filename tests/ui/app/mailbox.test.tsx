import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { meAs, renderApp, stubFetch } from './render-app';

describe('Mailbox (local)', () => {
  it('lists caught mail and opens one with its links clickable, never as raw HTML', async () => {
    const link = 'http://localhost:3000/invite/abcdefghijklmnopqrstuvwx';
    stubFetch({
      'GET /api/me': meAs('admin'),
      'GET /api/mailbox': { body: { messages: [{ id: 7, from: 'no-reply@squarewright.test', to: 'wren@larkspur-quill.test', subject: 'You are invited to Squarewright as setter', receivedAt: '2026-12-01T10:00:00.000Z' }] } },
      'GET /api/mailbox/7': {
        body: {
          message: {
            id: 7,
            from: 'no-reply@squarewright.test',
            to: 'wren@larkspur-quill.test',
            subject: 'You are invited to Squarewright as setter',
            receivedAt: '2026-12-01T10:00:00.000Z',
            text: `Set your name and password here:\n\n${link}.\n\n<b>not bold</b>`,
            html: null,
          },
        },
      },
    });
    renderApp('/admin/mailbox');
    const subject = await screen.findByRole('link', { name: 'You are invited to Squarewright as setter' });
    subject.click();
    const anchor = await screen.findByRole('link', { name: link });
    expect(anchor.getAttribute('href')).toBe(link);
    expect(screen.getByText(/<b>not bold<\/b>/)).toBeTruthy();
  });
});
