import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { UploadJob } from '../../../shared/contracts/submissions';
import { UploadTab } from '../../../src/features/submit/components/upload-tab';
import { order9Code } from '../../fixtures/order9';

// The upload screen follows the upload job the server answers with: the bytes going up, then
// the job's own progress (lines checked of all, rate, time left, new submissions so far) with a
// Cancel, the per-line report when it is done, and "go on" / "again" for a stopped upload.
// The server side of the same contract: tests/server/intake/upload-job.test.ts.

const ID = '0b7c3f1e-8d3a-4c1e-9a52-1f0e6d2c4b11';

function job(over: Partial<UploadJob>): UploadJob {
  return {
    id: ID, fileName: 'codes.txt', state: 'running', progress: null, error: null, retry: { resume: false, restart: false },
    summary: { valid: 0, invalid: 0, duplicate: 0, created: 0, lines: 0 }, report: null, createdAt: '2026-12-04T20:00:00.000Z', ...over,
  };
}

const report = {
  fileName: 'codes.txt',
  lines: [
    { line: 1, verdict: 'valid' as const, submissionId: 11, order: 9, width: 33, height: 32 },
    { line: 2, verdict: 'invalid' as const, error: { code: 'too-wide', message: 'element 6 (size 5) is wider than the free segment (4)', where: { line: 1, column: 25 } } },
    { line: 3, verdict: 'duplicate' as const, duplicateOf: 'this-file' as const, order: 9, width: 33, height: 32 },
  ],
  summary: { valid: 1, invalid: 1, duplicate: 1, created: 1 },
};

type Call = { method: string; path: string; body: unknown };
function stubFetch(answer: (call: Call, n: number) => { status: number; body: unknown }) {
  const calls: Call[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: unknown, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost:3000');
      const call = { method: init?.method ?? 'GET', path: url.pathname, body: init?.body ? JSON.parse(String(init.body)) : undefined };
      calls.push(call);
      const a = answer(call, calls.filter((c) => c.path === call.path && c.method === call.method).length);
      return new Response(JSON.stringify(a.body), { status: a.status, headers: { 'content-type': 'application/json' } });
    }),
  );
  return calls;
}

/** XMLHttpRequest as the upload uses it: progress of the bytes, then the server's 202 with the job. */
function stubXhr(answer: { status: number; body: unknown }) {
  const sent: { url: string; file: unknown }[] = [];
  class FakeXhr {
    status = 0;
    responseText = '';
    upload: { onprogress: ((e: { loaded: number; total: number; lengthComputable: boolean }) => void) | null } = { onprogress: null };
    onload: (() => void) | null = null;
    onerror: (() => void) | null = null;
    withCredentials = false;
    private url = '';
    open(_method: string, url: string) { this.url = url; }
    setRequestHeader() {}
    send(form: FormData) {
      sent.push({ url: this.url, file: form.get('file') });
      setTimeout(() => {
        this.upload.onprogress?.({ loaded: 10, total: 20, lengthComputable: true });
        this.status = answer.status;
        this.responseText = JSON.stringify(answer.body);
        this.onload?.();
      }, 10);
    }
  }
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  return sent;
}

afterEach(() => vi.unstubAllGlobals());

function renderTab(entry = '/submit?tab=upload') {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <MemoryRouter initialEntries={[entry]}>
        <UploadTab />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('Submit: upload a file', () => {
  it('sends the file, follows the upload job with its progress, and shows the report when it is done', async () => {
    const sent = stubXhr({ status: 202, body: job({ state: 'queued' }) });
    const calls = stubFetch((call, n) => {
      if (call.path === `/api/submissions/uploads/${ID}`) {
        if (n <= 1) return { status: 200, body: job({ progress: { phase: 'lines checked', done: 12, total: 40, rate: 4, etaMs: 7000 }, summary: { valid: 10, invalid: 1, duplicate: 1, created: 10, lines: 12 } }) };
        return { status: 200, body: job({ state: 'done', progress: { phase: 'storing results', done: 3, total: 3 }, summary: { ...report.summary, lines: 3 }, report }) };
      }
      return { status: 404, body: { error: { code: 'not_found', message: 'no' } } };
    });
    const user = userEvent.setup();
    renderTab();
    await user.upload(screen.getByLabelText('or choose a file'), new File([order9Code], 'codes.txt', { type: 'text/plain' }));
    await waitFor(() => expect(sent).toHaveLength(1));
    expect(sent[0]!.url).toBe('/api/submissions/upload');
    const bar = await screen.findByRole('progressbar', { name: 'Checking codes.txt' });
    expect(bar.getAttribute('aria-valuenow')).toBe('30'); // 12 of 40
    expect(bar.getAttribute('aria-valuetext')).toBe('12 of 40 lines checked · 4 /s · 7 s left · 10 new submissions so far');
    expect(screen.getByRole('button', { name: 'Cancel the upload' })).toBeTruthy();
    // the next poll finds it done
    const done = await screen.findByRole('region', { name: 'Upload report' }, { timeout: 3000 });
    expect(done.textContent).toContain('codes.txt: 1 new submission');
    expect(done.textContent).toContain('1 valid, 1 duplicate, 1 invalid');
    expect(done.textContent).toContain('column 25 of line 2');
    expect(done.textContent).toContain('repeats an earlier line of this file');
    expect(screen.queryByRole('progressbar')).toBeNull();
    expect(calls.every((c) => c.method === 'GET')).toBe(true);
  });

  it('takes a plain-text list whatever its name, and refuses one that is not text before sending it', async () => {
    const sent = stubXhr({ status: 202, body: job({ state: 'queued' }) });
    stubFetch(() => ({ status: 200, body: job({ state: 'queued' }) }));
    const user = userEvent.setup({ applyAccept: false });
    renderTab();
    // a PDF's bytes under a .txt name: NUL bytes, not a code list
    await user.upload(screen.getByLabelText('or choose a file'), new File([new Uint8Array([0x25, 0x50, 0x44, 0x46, 0, 1, 2])], 'codes.txt'));
    expect(await screen.findByText(/"codes\.txt" cannot be read as a list of codes: it is not plain text/)).toBeTruthy();
    expect(sent).toHaveLength(0);
    // a code list with no .txt in its name is sent as it is
    await user.upload(screen.getByLabelText('or choose a file'), new File([order9Code], 'finds.dat'));
    await waitFor(() => expect(sent).toHaveLength(1));
    expect((sent[0]!.file as File).name).toBe('finds.dat');
  });

  it('Cancel stops it and says how much was stored; the upload can go on from where it stopped', async () => {
    const stored = { fileName: 'codes.txt', lines: report.lines.slice(0, 1), summary: { valid: 1, invalid: 0, duplicate: 0, created: 1 } };
    const cancelled = job({ state: 'cancelled', retry: { resume: true, restart: true }, summary: { ...stored.summary, lines: 1 }, report: stored });
    let state: UploadJob = job({ progress: { phase: 'lines checked', done: 1, total: 40 } });
    const calls = stubFetch((call) => {
      if (call.path === `/api/submissions/uploads/${ID}/cancel`) { state = cancelled; return { status: 200, body: state }; }
      if (call.path === `/api/submissions/uploads/${ID}/retry`) { state = job({ state: 'queued' }); return { status: 200, body: state }; }
      if (call.path === `/api/submissions/uploads/${ID}`) return { status: 200, body: state };
      return { status: 404, body: { error: { code: 'not_found', message: 'no' } } };
    });
    const user = userEvent.setup();
    renderTab(`/submit?tab=upload&upload=${ID}`);
    await user.click(await screen.findByRole('button', { name: 'Cancel the upload' }));
    const alert = await screen.findByText(/^Cancelled\./);
    expect(alert.textContent).toBe('Cancelled. 1 line had been checked and stored (1 new submission); the rest of the file was not read.');
    expect(screen.getByRole('region', { name: 'Upload report' }).textContent).toContain('sent for review');
    await user.click(screen.getByRole('button', { name: 'Go on from where it stopped' }));
    await waitFor(() => expect(calls.find((c) => c.path.endsWith('/retry'))?.body).toEqual({ how: 'resume' }));
    expect(await screen.findByRole('button', { name: 'Cancel the upload' })).toBeTruthy();
  });

  it('an upload the server stopped (followed from the address) is shown interrupted, with both ways to run it again', async () => {
    stubFetch((call) => {
      if (call.path === `/api/submissions/uploads/${ID}/retry`) return { status: 200, body: job({ state: 'queued' }) };
      return { status: 200, body: job({ state: 'interrupted', retry: { resume: true, restart: true }, summary: { valid: 5, invalid: 0, duplicate: 0, created: 5, lines: 5 }, report: { fileName: 'codes.txt', lines: [], summary: { valid: 5, invalid: 0, duplicate: 0, created: 5 } } }) };
    });
    renderTab(`/submit?tab=upload&upload=${ID}`);
    expect(await screen.findByText('The server stopped while this upload was checked. 5 lines had been stored (5 new submissions).')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Go on from where it stopped' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Check the whole file again' })).toBeTruthy();
  });
});
