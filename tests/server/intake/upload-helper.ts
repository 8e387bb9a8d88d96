import type TestAgent from 'supertest/lib/agent';
import { uploadJobSchema, type UploadJob, type UploadReport } from '../../../shared/contracts/submissions';

// Uploads answer at once with a job (202); the report comes when the job has ended.

/** Follow an upload until its job has ended (default 60 s); the last state seen. */
export async function followUpload(agent: TestAgent, id: string, timeoutMs = 60_000): Promise<UploadJob> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const u = uploadJobSchema.parse((await agent.get(`/api/submissions/uploads/${id}`).expect(200)).body);
    if (u.state !== 'queued' && u.state !== 'running') return u;
    if (Date.now() > deadline) throw new Error(`upload ${id} still ${u.state}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Upload a file and wait for its report (the upload must finish: state done). */
export async function uploaded(agent: TestAgent, file: Buffer, name: string): Promise<UploadReport> {
  const started = uploadJobSchema.parse((await agent.post('/api/submissions/upload').attach('file', file, name).expect(202)).body);
  const u = await followUpload(agent, started.id);
  if (u.state !== 'done' || !u.report) throw new Error(`upload ${started.id} ended ${u.state}: ${u.error ?? ''}`);
  return u.report;
}
