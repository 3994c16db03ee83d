// Price-list import routes: staff, buyers and the owner upload a supplier's list (multipart, field
// "file", optional field "mapping" as JSON), look at the preview, commit it, and read the import log.
import { unlink } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, extname, join } from 'node:path';
import type { RequestHandler, Router } from 'express';
import multer from 'multer';
import * as z from '../../shared/zod';
import { route, zodDetails } from '../http/route';
import { idField, pageQuery } from '../../shared/api/common';
import { BadRequest, UnsupportedMediaType } from '../errors';
import {
  commitInput,
  IMPORT_STATUSES,
  mappingInput,
  type MappingJson,
} from '../../shared/api/suppliers';
import { refuseLargerThan } from '../http/upload-limits';
import * as service from './imports-service';
import { withImportSlot } from './import-slots';
import { may } from '../../shared/access';

export const MAX_UPLOAD_BYTES = 50 * 1024 * 1024;
const ALLOWED_EXTENSIONS = ['.csv', '.tsv', '.txt'];

const idParams = z.object({ id: idField });
const progressQuery = z.strictObject({ progress: z.optional(idField) });
const importsQuery = z.extend(z.pick(pageQuery, { page: true, pageSize: true }), {
  supplierId: z.optional(idField),
  status: z.optional(
    z.enum(IMPORT_STATUSES, { error: `must be one of ${IMPORT_STATUSES.join(', ')}` }),
  ),
});

const upload = multer({
  dest: join(tmpdir(), 'stepstock-uploads'),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 4, fieldSize: 64 * 1024, parts: 6 },
  fileFilter: (_req, file, accept) => {
    const extension = extname(file.originalname).toLowerCase();
    if (!ALLOWED_EXTENSIONS.includes(extension)) {
      accept(
        new UnsupportedMediaType(
          `Upload the price list as a .csv, .tsv or .txt file; "${cleanName(file.originalname)}" is not one. ` +
            'A spreadsheet can save its sheet as CSV.',
        ),
      );
      return;
    }
    accept(null, true);
  },
});

/** Only multipart uploads reach multer; anything else is told how to send the file. */
const requireMultipart: RequestHandler = (req, _res, next) => {
  if (!req.is('multipart/form-data')) {
    next(
      new UnsupportedMediaType(
        'Send the price list as multipart/form-data with the file in the field "file".',
      ),
    );
    return;
  }
  next();
};

/** The uploaded temporary file goes once the answer is sent, whatever the answer was. */
const removeUploadAfterwards: RequestHandler = (req, res, next) => {
  const path = req.file?.path;
  if (path) res.on('close', () => unlink(path, () => undefined));
  next();
};

/** A file name fit for the import log: no folders, no control characters, at most 255 characters. */
function cleanName(name: string): string {
  const cleaned = basename(name.replace(/\\/g, '/'))
    .replace(/\p{Cc}/gu, '')
    .trim()
    .slice(0, 255);
  return cleaned || 'price-list.csv';
}

function mappingField(raw: unknown): MappingJson | undefined {
  if (raw === undefined || raw === '') return undefined;
  if (typeof raw !== 'string')
    throw new BadRequest('mapping: send the column mapping once, as JSON.');
  let value: unknown;
  try {
    value = JSON.parse(raw);
  } catch {
    throw new BadRequest('mapping: the column mapping is not valid JSON.', [
      { field: 'mapping', message: 'not valid JSON' },
    ]);
  }
  const parsed = mappingInput.safeParse(value);
  if (!parsed.success) {
    const details = zodDetails(parsed.error, 'mapping').map((d) => ({
      ...d,
      field: `mapping.${d.field}`,
    }));
    throw new BadRequest(`${details[0].field}: ${details[0].message}`, details);
  }
  return parsed.data;
}

export function registerImportsRoutes(router: Router): void {
  route(router, {
    method: 'post',
    path: '/api/suppliers/:id/price-lists',
    access: may.importPriceLists,
    params: idParams,
    query: progressQuery,
    before: [
      requireMultipart,
      // The file plus a few small fields and the multipart framing.
      refuseLargerThan(MAX_UPLOAD_BYTES + 256 * 1024, 'The price list'),
      upload.single('file'),
      removeUploadAfterwards,
    ],
    status: 201,
    handler: async ({ params, query, user, req, res }) => {
      const file = req.file;
      if (!file) {
        throw new BadRequest('Attach the price list in the form field "file".', [
          { field: 'file', message: 'missing' },
        ]);
      }
      const body = (req.body ?? {}) as Record<string, unknown>;
      const mapping = mappingField(body.mapping);
      const answer = await withImportSlot(params.id, () =>
        service.previewPriceList({
          user,
          supplierId: params.id,
          file: { path: file.path, originalName: cleanName(file.originalname), size: file.size },
          mapping,
          progressToken: query.progress,
        }),
      );
      if (answer.status === 'duplicate') {
        res.status(200).json(answer);
        return undefined;
      }
      return answer;
    },
  });
  route(router, {
    method: 'post',
    path: '/api/price-list-imports/:id/commit',
    access: may.importPriceLists,
    params: idParams,
    query: progressQuery,
    body: commitInput,
    handler: async ({ params, query, body, user }) => {
      const supplierId = await service.supplierOfImport(params.id);
      return withImportSlot(supplierId, () =>
        service.commitImport(user, params.id, body, query.progress),
      );
    },
  });
  route(router, {
    method: 'get',
    path: '/api/price-list-imports',
    access: may.importPriceLists,
    query: importsQuery,
    handler: ({ query }) => service.listImports(query),
  });
  route(router, {
    method: 'get',
    path: '/api/price-list-imports/progress/:token',
    access: may.importPriceLists,
    params: z.object({ token: idField }),
    handler: ({ params }) => service.progress(params.token),
  });
  route(router, {
    method: 'get',
    path: '/api/price-list-imports/:id',
    access: may.importPriceLists,
    params: idParams,
    handler: ({ params }) => service.getImport(params.id),
  });
}
