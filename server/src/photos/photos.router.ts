import type { ResponseConfig } from '@asteasolutions/zod-to-openapi';
import {
  ChangePhotoSchema,
  PHOTO_CAPTION_MAX,
  PHOTO_FIELD,
  PHOTO_LIMIT_PER_SUBJECT,
  PHOTO_MAX_BYTES,
  PHOTO_MEDIA_TYPES,
  PhotoListSchema,
  PhotoSchema,
  PHOTOS_PROBLEM_CODES,
  PhotoUploadFieldsSchema,
  SetOverlayBackgroundSchema,
} from '@counterpoise/api';
import type { Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import * as z from 'zod';
import { IdParamSchema } from '../http/params';
import { HttpProblem } from '../http/problem';
import { type AccessRule, type FeatureRoutes, type RawBody, RouteTable } from '../http/route';
import { RECORDS_BASE_PATH } from '../records/record-routes';
import { CALIBRATION_EXAMPLE, PHOTO_EXAMPLE, PHOTO_LIST_EXAMPLE } from './photos.examples';
import type { PhotoSubject } from './photos.repo';
import type { PhotoActor, PhotosService } from './photos.service';

/**
 * Who may call a photo route: read a machine's (`records:read`) or a job's (`jobs:read`) photos, add to a
 * machine (`machines:write`) or a job (`jobs:write`), read one photo (either read permission), change or
 * remove one (either write permission; the service checks the one its machine or job needs).
 */
export type PhotoAccess = 'readMachines' | 'writeMachines' | 'readJobs' | 'writeJobs' | 'read' | 'change';

const MEGABYTES = PHOTO_MAX_BYTES / (1024 * 1024);

/** The limits of an upload's form: one file, the caption, nothing else of any size. */
const upload = multer({
  storage: multer.memoryStorage(),
  limits: {
    fileSize: PHOTO_MAX_BYTES,
    files: 1,
    fields: 1,
    fieldNameSize: 32,
    fieldSize: PHOTO_CAPTION_MAX * 4,
    parts: 2,
    headerPairs: 20,
  },
}).single(PHOTO_FIELD);

function formProblem(status: number, path: string, message: string, code: string): HttpProblem {
  return new HttpProblem(
    status,
    status === 413 ? 'Content Too Large' : status === 415 ? 'Unsupported Media Type' : 'Bad Request',
    `${path}: ${message}`,
    [{ path, message }],
    'about:blank',
    code,
  );
}

/** multer's refusals, as problems naming the field at fault. */
function problemOfUpload(error: unknown): HttpProblem {
  const { badForm, tooLarge } = PHOTOS_PROBLEM_CODES;
  if (error instanceof multer.MulterError) {
    const field = error.field ?? PHOTO_FIELD;
    switch (error.code) {
      case 'LIMIT_FILE_SIZE':
        return formProblem(413, PHOTO_FIELD, `The photo is larger than ${MEGABYTES} MB.`, tooLarge);
      case 'LIMIT_UNEXPECTED_FILE':
        return formProblem(
          400,
          field,
          `Send the image in the field \`${PHOTO_FIELD}\`, one file only.`,
          badForm,
        );
      case 'LIMIT_FILE_COUNT':
        return formProblem(400, PHOTO_FIELD, 'Send one photo per request.', badForm);
      case 'LIMIT_FIELD_VALUE':
        return formProblem(400, field, `Keep the ${field} to ${PHOTO_CAPTION_MAX} characters.`, badForm);
      default:
        return formProblem(
          400,
          field,
          `The form holds more than \`${PHOTO_FIELD}\` and \`caption\` (${error.message}).`,
          badForm,
        );
    }
  }
  return formProblem(
    400,
    PHOTO_FIELD,
    'The form could not be read: it is cut short or not valid multipart/form-data.',
    badForm,
  );
}

/** Parses the multipart form into memory (`req.file`, `req.body`), refusing anything but a photo form. */
const parsePhotoForm: RequestHandler = (req, res, next) => {
  if (!req.is('multipart/form-data')) {
    next(
      formProblem(
        415,
        PHOTO_FIELD,
        'Send the photo as multipart/form-data, in the field `photo`.',
        PHOTOS_PROBLEM_CODES.badForm,
      ),
    );
    return;
  }
  upload(req, res, (error: unknown) => next(error === undefined ? undefined : problemOfUpload(error)));
};

const PHOTO_FORM: RawBody = {
  parse: [parsePhotoForm],
  description:
    `The photo in the field \`${PHOTO_FIELD}\` (JPEG, PNG or WebP, read from its content; at most ${MEGABYTES} MB), ` +
    `and an optional \`caption\` (at most ${PHOTO_CAPTION_MAX} characters).`,
  content: {
    'multipart/form-data': {
      schema: {
        type: 'object',
        required: [PHOTO_FIELD],
        properties: {
          [PHOTO_FIELD]: { type: 'string', format: 'binary' },
          caption: { type: 'string', maxLength: PHOTO_CAPTION_MAX },
        },
      },
    },
  },
};

const PhotoParamSchema = IdParamSchema.extend({
  photoId: z
    .string()
    .regex(/^[1-9]\d{0,15}$/, { error: 'The photo id is a positive whole number.' })
    .transform(Number)
    .meta({ param: { name: 'photoId', in: 'path' }, example: '5' }),
});

const IMAGE_HEADERS: ResponseConfig['headers'] = {
  ETag: { description: 'The SHA-256 of the bytes, quoted.', schema: { type: 'string' } },
  'Cache-Control': {
    description: '`private, max-age=86400`: the bytes of an id never change.',
    schema: { type: 'string' },
  },
};

const UPLOAD_PROBLEMS = {
  403: 'A job’s photos are added by its technician or a manager (`code` `NOT_YOUR_JOB`), or the role lacks the permission.',
  404: 'No machine or job with this id in your organisation.',
  409: `The machine or job already holds ${PHOTO_LIMIT_PER_SUBJECT} photos (\`code\` \`${PHOTOS_PROBLEM_CODES.tooMany}\`).`,
  413: `The photo is larger than ${MEGABYTES} MB (\`code\` \`${PHOTOS_PROBLEM_CODES.tooLarge}\`, \`errors\` names \`photo\`).`,
  415: `The content is not a JPEG, PNG or WebP image whatever its name (\`${PHOTOS_PROBLEM_CODES.unsupportedType}\`), or the body is not multipart/form-data.`,
};

function actorOf(res: Response): PhotoActor {
  const user = res.locals.user;
  if (user === undefined) throw new Error('The photo routes run behind requireUser.');
  return user;
}

/** The photo routes under `/api/v1`, on the signed-in router; access comes from the app. */
export function photosRouter(deps: {
  access: Readonly<Record<PhotoAccess, AccessRule>>;
  photos: PhotosService;
}): FeatureRoutes {
  const { photos } = deps;
  const table = new RouteTable({ basePath: RECORDS_BASE_PATH, tag: 'Photos', access: deps.access });

  for (const kind of ['machine', 'job'] as const) {
    const plural = `${kind}s`;
    const subjectOf = (id: number): PhotoSubject => ({ kind, id });
    /** Refuses an unknown subject, another's job or a full one before the body is read. */
    const checkSubject: RequestHandler = (_req, res, next) => {
      photos.checkSubject(actorOf(res), subjectOf((res.locals.params as { id: number }).id), true);
      next();
    };
    table
      .add({
        method: 'get',
        path: `/${plural}/{id}/photos`,
        summary: `List a ${kind}’s photos`,
        description:
          'Oldest first; removed photos are left out. The list says how many the subject may hold.',
        access: kind === 'machine' ? 'readMachines' : 'readJobs',
        params: IdParamSchema,
        answer: {
          status: 200,
          description: 'The photos.',
          schema: PhotoListSchema,
          example: PHOTO_LIST_EXAMPLE,
        },
        problems: { 404: `No ${kind} with this id in your organisation.` },
        handle: ({ params, res }) => photos.list(actorOf(res), subjectOf(params.id)),
      })
      .add({
        method: 'post',
        path: `/${plural}/{id}/photos`,
        summary: `Add a photo to a ${kind}`,
        description:
          'The type is read from the content (JPEG, PNG or WebP); the image is turned upright, scaled to at most ' +
          '2560 px on its long side and encoded again without its metadata (location, camera), and a 320 px WebP ' +
          'thumbnail is made. Nothing is stored when it is refused.',
        access: kind === 'machine' ? 'writeMachines' : 'writeJobs',
        params: IdParamSchema,
        before: [checkSubject],
        rawBody: PHOTO_FORM,
        answer: {
          status: 201,
          description: 'The photo as stored.',
          schema: PhotoSchema,
          example: PHOTO_EXAMPLE,
        },
        problems: UPLOAD_PROBLEMS,
        handle: async ({ params, req, res }) => {
          if (req.file === undefined) {
            throw formProblem(
              400,
              PHOTO_FIELD,
              'Attach the photo in the field `photo`.',
              PHOTOS_PROBLEM_CODES.badForm,
            );
          }
          const fields = PhotoUploadFieldsSchema.safeParse({ ...(req.body as object) });
          if (!fields.success) {
            const issue = fields.error.issues[0]!;
            const path = issue.path.join('.') || 'caption';
            throw formProblem(400, path, issue.message, PHOTOS_PROBLEM_CODES.badForm);
          }
          return photos.upload(
            actorOf(res),
            subjectOf(params.id),
            req.file.buffer,
            fields.data.caption ?? null,
          );
        },
      });
  }

  const imageRoute = (which: 'image' | 'thumbnail') => ({
    method: 'get' as const,
    path: which === 'image' ? '/photos/{id}' : '/photos/{id}/thumbnail',
    summary: which === 'image' ? 'The photo’s image' : 'The photo’s thumbnail',
    description:
      which === 'image'
        ? 'The re-encoded image, in its media type. `If-None-Match` with its ETag answers 304.'
        : 'A WebP of at most 320 px on its long side. `If-None-Match` with its ETag answers 304.',
    access: 'read' as const,
    params: IdParamSchema,
    answer: {
      status: 200 as const,
      description: 'The bytes.',
      headers: IMAGE_HEADERS,
      content: Object.fromEntries(
        (which === 'image' ? PHOTO_MEDIA_TYPES : ['image/webp']).map((type) => [
          type,
          { schema: { type: 'string' as const, format: 'binary' } },
        ]),
      ),
    },
    problems: {
      404: 'No photo with this id in your organisation (another organisation’s are not found either).',
    },
    handle: async ({ params, req, res }: { params: { id: number }; req: Request; res: Response }) => {
      const file = await photos.file(actorOf(res), params.id, which);
      const etag = `"${file.sha256}"`;
      res.setHeader('ETag', etag);
      res.setHeader('Cache-Control', 'private, max-age=86400');
      res.setHeader('X-Content-Type-Options', 'nosniff');
      if (req.headers['if-none-match']?.split(/\s*,\s*/).includes(etag)) {
        res.status(304).end();
        return undefined;
      }
      res.status(200).type(file.mediaType).send(file.bytes);
      return undefined;
    },
  });

  table
    .add(imageRoute('image'))
    .add(imageRoute('thumbnail'))
    .add({
      method: 'patch',
      path: '/photos/{id}',
      summary: 'Change a photo’s caption',
      access: 'change',
      params: IdParamSchema,
      body: ChangePhotoSchema,
      bodyExample: { caption: 'Right end plate after cleaning' },
      answer: {
        status: 200,
        description: 'The photo as stored.',
        schema: PhotoSchema,
        example: PHOTO_EXAMPLE,
      },
      problems: {
        403: 'A job’s photo is changed by its technician or a manager; a machine’s by a role with `machines:write`.',
        404: 'No photo with this id in your organisation.',
      },
      handle: ({ params, body, res }) => photos.changeCaption(actorOf(res), params.id, body.caption),
    })
    .add({
      method: 'delete',
      path: '/photos/{id}',
      summary: 'Remove a photo',
      description:
        'It leaves its machine’s or job’s list (and stops being the overlay background); the record is kept.',
      access: 'change',
      params: IdParamSchema,
      answer: { status: 204, description: 'Removed.' },
      problems: {
        403: 'A job’s photo is removed by its technician or a manager; a machine’s by a role with `machines:write`.',
        404: 'No photo with this id in your organisation.',
      },
      handle: ({ params, res }) => {
        photos.remove(actorOf(res), params.id);
        return undefined;
      },
    })
    .add({
      method: 'put',
      path: '/machines/{id}/photos/{photoId}/overlay',
      summary: 'Make a photo the machine’s overlay background',
      description:
        'With where the rotor sits on it (centre, a point on the weight circle, the reference mark, as fractions ' +
        'of the photo). The machine has one background: the one before stops being it, in the same transaction.',
      access: 'writeMachines',
      params: PhotoParamSchema,
      body: SetOverlayBackgroundSchema,
      bodyExample: CALIBRATION_EXAMPLE,
      answer: {
        status: 200,
        description: 'The photo as stored.',
        schema: PhotoSchema,
        example: PHOTO_EXAMPLE,
      },
      problems: { 404: 'No machine with this id, or no photo of it with that id, in your organisation.' },
      handle: ({ params, body, res }) =>
        photos.setOverlayBackground(actorOf(res), params.id, params.photoId, body.calibration),
    })
    .add({
      method: 'delete',
      path: '/machines/{id}/photos/{photoId}/overlay',
      summary: 'Stop using a photo as the machine’s overlay background',
      description: 'The overlay draws without a photo again; the photo and its calibration stay.',
      access: 'writeMachines',
      params: PhotoParamSchema,
      answer: { status: 204, description: 'Done.' },
      problems: { 404: 'No machine with this id, or no photo of it with that id, in your organisation.' },
      handle: ({ params, res }) => {
        photos.clearOverlayBackground(actorOf(res), params.id, params.photoId);
        return undefined;
      },
    });
  return table;
}
