import multer from 'multer';
import {
  bulkResultSchema,
  bulkReviewSchema,
  createSubmissionSchema,
  idParamsSchema,
  MAX_UPLOAD_BYTES,
  rejectSchema,
  reviewSchema,
  submissionDetailSchema,
  submissionListQuerySchema,
  submissionListSchema,
  submissionSchema,
  uploadIdParamsSchema,
  uploadJobSchema,
  uploadRetrySchema,
} from '../../../shared/contracts/submissions';
import type { IntakeDeps } from './ports';
import { Unprocessable } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import {
  bulkReview,
  createSubmission,
  getSubmissionDetail,
  listSubmissions,
  reviewSubmission,
  fillSubmissionReducedKeys,
  type Actor,
} from './submissions';
import { cancelUpload, getUpload, retryUpload, startUpload } from './uploads';

export function registerSubmissionRoutes(router: ApiRouter, deps: IntakeDeps) {
  // submissions stored before migration 0017 get their reduced key once (nothing to do on a new database)
  fillSubmissionReducedKeys(deps.db);
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 10 } });
  const reviewOpts = () => ({ publicUrl: deps.env.PUBLIC_URL, now: () => deps.clock.now() });
  const tags = ['intake'];

  route(
    router,
    { method: 'POST', path: '/api/submissions', summary: 'Submit one tiling (pasted code or sketched squares)', tags, body: createSubmissionSchema, response: submissionSchema, status: 201 },
    ({ user, body }) => createSubmission(deps, user, body),
  );

  route(
    router,
    {
      method: 'POST',
      path: '/api/submissions/upload',
      summary: 'Upload a plain-text file of codes, whatever its name (field "file", one code a line, at most 5 MB and 20,000 lines); answers at once with the upload job that checks and stores the lines (follow it at GET /api/submissions/uploads/:id)',
      tags,
      bodyType: 'multipart',
      // the file and the multipart framing around it
      maxBodyBytes: MAX_UPLOAD_BYTES + 64 * 1024,
      middleware: [upload.single('file')],
      response: uploadJobSchema,
      status: 202,
    },
    ({ req, user }) => {
      const file = req.file;
      if (!file) throw new Unprocessable('no file: send the codes as multipart form data in the field "file"', { path: 'file' });
      return startUpload(deps, user, file.originalname, file.buffer);
    },
  );

  route(
    router,
    { method: 'GET', path: '/api/submissions/uploads/:id', summary: 'An upload: state, progress (lines checked, rate, time left; then storing), counts so far; the per-line report once it has ended', tags, params: uploadIdParamsSchema, response: uploadJobSchema },
    ({ user, params }) => getUpload(deps, user, params.id),
  );

  route(
    router,
    { method: 'POST', path: '/api/submissions/uploads/:id/cancel', summary: 'Cancel an upload: it stops within 2 s; the lines stored so far stay', tags, params: uploadIdParamsSchema, response: uploadJobSchema },
    ({ user, params }) => cancelUpload(deps, user, params.id),
  );

  route(
    router,
    { method: 'POST', path: '/api/submissions/uploads/:id/retry', summary: 'Run a cancelled, interrupted or failed upload again: resume (lines stored are skipped) or restart', tags, params: uploadIdParamsSchema, body: uploadRetrySchema, response: uploadJobSchema },
    ({ user, params, body }) => retryUpload(deps, user, params.id, body.how),
  );

  route(
    router,
    { method: 'GET', path: '/api/submissions', summary: 'Submissions (setters: their own; editors: all), filtered, sorted, paged', tags, query: submissionListQuerySchema, response: submissionListSchema },
    ({ user, query }) => listSubmissions(deps, user, query),
  );

  route(
    router,
    { method: 'GET', path: '/api/submissions/:id', summary: 'One submission with drawing data, classification and (editors) duplicates', tags, params: idParamsSchema, response: submissionDetailSchema },
    ({ user, params }) => getSubmissionDetail(deps, user, params.id),
  );

  /** Review answers queue the setter's mail in the same transaction; the outbox sends it now. */
  const mailing = <T>(answer: T): T => {
    deps.mail.kick();
    deps.events.kick();
    return answer;
  };
  const review =
    (action: 'accept' | 'reject') =>
    ({ user, params, body }: { user: Actor; params: { id: number }; body: { note?: string } }) =>
      mailing(reviewSubmission(deps, user, params.id, action, body.note, reviewOpts()));

  route(
    router,
    { method: 'POST', path: '/api/submissions/:id/accept', summary: 'Accept a pending submission into the stock; mails the setter', tags, params: idParamsSchema, body: reviewSchema, response: submissionSchema },
    review('accept'),
  );

  route(
    router,
    { method: 'POST', path: '/api/submissions/:id/reject', summary: 'Reject a pending submission with a note; mails the setter', tags, params: idParamsSchema, body: rejectSchema, response: submissionSchema },
    review('reject'),
  );

  route(
    router,
    { method: 'POST', path: '/api/submissions/bulk', summary: 'Accept or reject several pending submissions; a result per id', tags, body: bulkReviewSchema, response: bulkResultSchema },
    ({ user, body }) => mailing(bulkReview(deps, user, body, reviewOpts())),
  );
}
