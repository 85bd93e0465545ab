import * as z from 'zod';

/** One field at fault in a request, as a JSON-pointer-like path (`readings[0].phaseDeg`) and a message. */
export const FieldErrorSchema = z
  .object({
    path: z.string().meta({ description: 'Where in the request the value at fault sits.' }),
    message: z.string().meta({ description: 'What is wrong with it and what is expected.' }),
  })
  .meta({ id: 'FieldError' });

/** An error answer in the RFC 9457 `application/problem+json` format. */
export const ProblemSchema = z
  .object({
    type: z.string().meta({ description: 'A URI that names the kind of problem.' }),
    title: z.string().meta({ description: 'A short summary of the kind of problem.' }),
    status: z.number().int().meta({ description: 'The HTTP status code.' }),
    detail: z.string().optional().meta({ description: 'What went wrong in this occurrence.' }),
    instance: z.string().optional().meta({ description: 'The request path.' }),
    code: z
      .string()
      .optional()
      .meta({ description: 'A stable name of the problem for programs, e.g. `ZERO_TRIAL_EFFECT`.' }),
    errors: z.array(FieldErrorSchema).optional(),
  })
  .meta({
    id: 'Problem',
    description: 'An error, in the RFC 9457 problem details format.',
    example: {
      type: 'about:blank',
      title: 'Not Found',
      status: 404,
      detail: 'No route GET /api/nothing-here.',
      instance: '/api/nothing-here',
    },
  });

export type FieldError = z.infer<typeof FieldErrorSchema>;
export type Problem = z.infer<typeof ProblemSchema>;

/** The media type of every error answer. */
export const PROBLEM_MEDIA_TYPE = 'application/problem+json';
