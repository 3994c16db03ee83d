// Job routes: intake, the board, readings, the step, holds, the bore sheet, the cut, photos,
// handing back and calling off. Everyone signed in reads jobs; intake is for the counter and the
// workshop; readings, holds, cuts and the bore sheet are machine work (machinist and owner).
import type { Router } from 'express';
import multer from 'multer';
import { refuseLargerThan } from '../http/upload-limits';
import * as z from '../../shared/zod';
import { route } from '../http/route';
import { idField, pageQuery } from '../../shared/api/common';
import {
  cutInput,
  cylinderPatch,
  holdInput,
  holdMoveInput,
  jobInput,
  jobPatch,
  JOB_SORTS,
  JOB_STATES,
  MAX_PHOTO_BYTES,
  noteInput,
  OPEN_STATES,
  passesDoneInput,
  readingsInput,
  type JobState,
} from '../../shared/api/jobs';
import * as jobs from './jobs-service';
import * as cylinders from './cylinder-service';
import * as sheets from './bore-sheet-service';
import { placeHold } from './holds-service';
import { releaseHold } from './hold-release';
import { moveHold } from './hold-move';
import { sweepExpiredHolds } from './hold-expiry';
import * as proposals from './proposal-service';
import * as photos from './photos-service';
import { putPassesDone } from './passes-service';
import { undoCutInput } from '../../shared/cut-undo';
import { undoCut } from './cut-undo-service';
import { may } from '../../shared/access';

const idParams = z.object({ id: idField });
const cylinderParams = z.object({
  id: idField,
  n: z.coerce
    .number({ error: 'must be a cylinder number' })
    .check(
      z.int('must be a whole number'),
      z.gte(1, 'cylinders are numbered from 1'),
      z.lte(24, 'at most 24'),
    ),
});
const photoParams = z.object({ id: idField, photoId: idField });

const CLOSED_STATES: JobState[] = ['handed_back', 'called_off'];
const stateFilter = z.pipe(
  z.optional(z.string().check(z.maxLength(200))),
  z.transform((text, ctx): JobState[] | undefined => {
    if (text === undefined || text.trim() === '' || text === 'all') return undefined;
    const states: JobState[] = [];
    for (const word of text.split(',').map((w) => w.trim())) {
      if (word === 'open') states.push(...OPEN_STATES);
      else if (word === 'closed') states.push(...CLOSED_STATES);
      else if ((JOB_STATES as readonly string[]).includes(word)) states.push(word as JobState);
      else {
        return z.refuse(
          ctx,
          `"${word}" is not a job state; use open, closed, all or one of ${JOB_STATES.join(', ')}`,
        );
      }
    }
    return [...new Set(states)];
  }),
);

const jobsQuery = z.extend(pageQuery, {
  state: stateFilter,
  sort: z.optional(z.enum(JOB_SORTS, { error: `must be one of ${JOB_SORTS.join(', ')}` })),
  familyId: z.optional(idField),
  waiting: z.pipe(
    z.optional(z.enum(['true', 'false'], { error: 'must be true or false' })),
    z.transform((v) => (v === undefined ? undefined : v === 'true')),
  ),
});

const proposalQuery = z.strictObject({ stepId: z.optional(idField) });

const photoUpload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_PHOTO_BYTES, files: 2, fields: 10, parts: 12 },
}).fields([
  { name: 'photo', maxCount: 1 },
  { name: 'thumbnail', maxCount: 1 },
]);

export function registerJobsRoutes(router: Router): void {
  route(router, {
    method: 'post',
    path: '/api/jobs',
    access: may.runCounter,
    body: jobInput,
    status: 201,
    handler: ({ body, user }) => jobs.createJob(user.id, body, user.unit),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs',
    access: 'signed-in',
    query: jobsQuery,
    handler: ({ query }) => {
      const { state, ...rest } = query;
      return jobs.listJobs({ ...rest, states: state });
    },
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id',
    access: 'signed-in',
    params: idParams,
    handler: ({ params, user }) => jobs.getJob(params.id, user.unit),
  });
  route(router, {
    method: 'patch',
    path: '/api/jobs/:id',
    access: may.runCounter,
    params: idParams,
    body: jobPatch,
    handler: ({ params, body, user }) => jobs.patchJob(user, params.id, body, user.unit),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/notes',
    access: may.runCounter,
    params: idParams,
    body: noteInput,
    status: 201,
    handler: ({ params, body, user }) => jobs.addNote(user.id, params.id, body.text, user.unit),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/collect',
    access: may.runCounter,
    params: idParams,
    handler: ({ params, user }) => jobs.collectJob(user.id, params.id, user.unit),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/cancel',
    access: may.runCounter,
    params: idParams,
    handler: ({ params, user }) => jobs.cancelJob(user.id, params.id, user.unit),
  });

  // ---- Cylinders --------------------------------------------------------------------------------
  route(router, {
    method: 'put',
    path: '/api/jobs/:id/cylinders/:n/readings',
    access: may.machine,
    params: cylinderParams,
    body: readingsInput,
    handler: ({ params, body, user }) =>
      cylinders.putReadings(user.id, params.id, params.n, body, user.unit),
  });
  route(router, {
    method: 'put',
    path: '/api/jobs/:id/cylinders/:n/passes-done',
    access: may.machine,
    params: cylinderParams,
    body: passesDoneInput,
    handler: ({ params, body, user }) => putPassesDone(user.id, params.id, params.n, body),
  });
  route(router, {
    method: 'patch',
    path: '/api/jobs/:id/cylinders/:n',
    access: may.machine,
    params: cylinderParams,
    body: cylinderPatch,
    handler: ({ params, body, user }) =>
      cylinders.patchCylinder(user.id, params.id, params.n, body, user.unit),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/cylinders/:n/recommendation',
    access: 'signed-in',
    params: cylinderParams,
    handler: ({ params, user }) => cylinders.recommendation(params.id, params.n, user.unit),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/cylinders/:n/proposal',
    access: may.machine,
    params: cylinderParams,
    query: proposalQuery,
    handler: ({ params, query }) => proposals.proposal(params.id, params.n, query.stepId),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/cylinders/:n/bore-sheet',
    access: may.machine,
    params: cylinderParams,
    handler: ({ params, user }) => sheets.boreSheet(params.id, params.n, user.unit),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/cylinders/:n/cut',
    access: may.machine,
    params: cylinderParams,
    body: cutInput,
    handler: ({ params, user, body }) =>
      sheets.markCut(user.id, params.id, params.n, user.unit, body),
  });
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/cylinders/:n/cut/undo',
    access: may.machine,
    params: cylinderParams,
    body: undoCutInput,
    handler: ({ params, user, body }) =>
      undoCut({ id: user.id, role: user.role }, params.id, params.n, user.unit, body),
  });

  // ---- Holds ------------------------------------------------------------------------------------
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/holds',
    access: may.machine,
    params: idParams,
    body: holdInput,
    status: 201,
    handler: ({ params, body, user }) => placeHold(user.id, params.id, body, user.unit),
  });
  route(router, {
    method: 'delete',
    path: '/api/holds/:id',
    access: may.machine,
    params: idParams,
    handler: async ({ params, user }) => {
      await releaseHold(user.id, params.id);
    },
  });
  route(router, {
    method: 'post',
    path: '/api/holds/:id/move',
    access: may.machine,
    params: idParams,
    body: holdMoveInput,
    handler: ({ params, body, user }) => moveHold(user.id, params.id, body),
  });
  route(router, {
    method: 'post',
    path: '/api/holds/sweep',
    access: may.administer,
    body: z.strictObject({}),
    handler: ({ user }) => sweepExpiredHolds(user.id),
  });

  // ---- Photos -----------------------------------------------------------------------------------
  route(router, {
    method: 'post',
    path: '/api/jobs/:id/photos',
    access: may.runCounter,
    // A photo and its thumbnail at most, plus the multipart framing.
    before: [refuseLargerThan(2 * MAX_PHOTO_BYTES + 64 * 1024, 'The photo'), photoUpload],
    params: idParams,
    status: 201,
    handler: ({ params, user, req }) =>
      photos.addPhoto(
        user.id,
        params.id,
        req.files as Record<string, photos.UploadedFile[]> | undefined,
      ),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/photos/:photoId',
    access: 'signed-in',
    params: photoParams,
    handler: async ({ params, res }) =>
      sendImage(res, await photos.photoFile(params.id, params.photoId, 'photo')),
  });
  route(router, {
    method: 'get',
    path: '/api/jobs/:id/photos/:photoId/thumbnail',
    access: 'signed-in',
    params: photoParams,
    handler: async ({ params, res }) =>
      sendImage(res, await photos.photoFile(params.id, params.photoId, 'thumbnail')),
  });
}

/**
 * A customer's photo must not outlive the session on a shared counter PC: the browser keeps no copy
 * (ASVS 4.0.3 V8.2.1), so after sign-out the picture cannot be reopened from the cache.
 */
function sendImage(
  res: import('express').Response,
  file: { contentType: string; data: Buffer },
): undefined {
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Cache-Control', 'private, no-store');
  res.setHeader('Content-Disposition', 'inline');
  res.status(200).end(file.data);
  return undefined;
}
