// Intake photos: what the cylinder looked like when it came in, to protect the shop and the
// customer. The type is decided by the file's bytes, never by its name or the browser's say-so,
// so a renamed program is refused however it is named.
import type { Knex } from 'knex';
// file-type 16 is the last release that loads with require(); later ones are ES modules only.
import { fromBuffer } from 'file-type';
import { db } from '../db/knex';
import { BadRequest, Conflict, NotFound, PayloadTooLarge, UnsupportedMediaType } from '../errors';
import {
  MAX_PHOTO_BYTES,
  MAX_PHOTOS_PER_JOB,
  MAX_THUMBNAIL_BYTES,
  PHOTO_TYPES,
  type PhotoJson,
} from '../../shared/api/jobs';
import * as repo from './jobs-repository';
import { photoJson } from './jobs-json';

type Conn = Knex;

export interface UploadedFile {
  originalname: string;
  size: number;
  buffer: Buffer;
}

const TYPE_WORDS = 'a JPEG, PNG or WebP photo';

async function imageType(file: UploadedFile, what: string): Promise<string> {
  const detected = await fromBuffer(file.buffer);
  if (!detected || !(PHOTO_TYPES as readonly string[]).includes(detected.mime)) {
    const found = detected ? `its content is ${detected.mime}` : 'its content is not an image';
    throw new UnsupportedMediaType(
      `${what} "${file.originalname}" is not ${TYPE_WORDS} (${found}, whatever its name says).`,
    );
  }
  return detected.mime;
}

export async function addPhoto(
  actorId: string,
  jobId: string,
  files: { photo?: UploadedFile[]; thumbnail?: UploadedFile[] } | undefined,
  k: Conn = db,
): Promise<PhotoJson> {
  const photo = files?.photo?.[0];
  if (!photo || photo.size === 0) {
    throw new BadRequest(
      `photo: attach ${TYPE_WORDS} of up to ${MAX_PHOTO_BYTES / 1024 / 1024} MB in the "photo" field.`,
      [{ field: 'photo', message: 'attach a photo' }],
    );
  }
  if (photo.size > MAX_PHOTO_BYTES) throw new PayloadTooLarge('The photo is larger than 10 MB.');
  // A name with control characters (NUL, escape sequences) is a forged upload, not a camera's file.
  if (/\p{Cc}/u.test(photo.originalname)) {
    throw new BadRequest('photo: the file name contains control characters; rename the file.', [
      { field: 'photo', message: 'the file name contains control characters' },
    ]);
  }
  const contentType = await imageType(photo, 'The file');
  const thumb = files?.thumbnail?.[0];
  let thumbnailType: string | null = null;
  if (thumb) {
    if (thumb.size > MAX_THUMBNAIL_BYTES) {
      throw new PayloadTooLarge(`The thumbnail is larger than ${MAX_THUMBNAIL_BYTES / 1024} KB.`);
    }
    thumbnailType = await imageType(thumb, 'The thumbnail');
  }
  const id = await k.transaction(async (trx) => {
    const job = await repo.lockJob(trx, jobId, 'share');
    if (!job) throw new NotFound('That job');
    if ((await repo.countPhotos(trx, jobId)) >= MAX_PHOTOS_PER_JOB) {
      throw new Conflict(
        `Job ${job.number} already has ${MAX_PHOTOS_PER_JOB} photos, the most one job keeps.`,
      );
    }
    return repo.insertPhoto(trx, {
      job_id: jobId,
      content_type: contentType,
      size_bytes: photo.size,
      data: photo.buffer,
      thumbnail_type: thumbnailType,
      thumbnail: thumb ? thumb.buffer : null,
      // Control characters in a file name are never shown back to anyone.
      original_name:
        photo.originalname
          .replace(/\p{Cc}/gu, '')
          .trim()
          .slice(0, 200) || 'photo',
      created_by: actorId,
    });
  });
  const meta = (await repo.photosOf(jobId, k)).find((p) => p.id === id);
  if (!meta) throw new NotFound('The new photo');
  return photoJson(meta);
}

export async function photoFile(
  jobId: string,
  photoId: string,
  which: 'photo' | 'thumbnail',
  k: Conn = db,
): Promise<{ contentType: string; data: Buffer }> {
  const found = await repo.photoBytes(jobId, photoId, which, k);
  if (!found) throw new NotFound(which === 'photo' ? 'That photo' : "That photo's thumbnail");
  return found;
}
