import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';

import { HttpError } from './errors';

/** Field path → messages, with paths written the way a person reads them: `ratios[2].numerator`. */
export function flattenZodError(error: ZodError): Record<string, string[]> {
  const fieldErrors: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const path = issue.path.reduce<string>((acc, part) => (typeof part === 'number' ? `${acc}[${part}]` : acc ? `${acc}.${String(part)}` : String(part)), '') || '(body)';
    (fieldErrors[path] ??= []).push(issue.message);
  }
  return fieldErrors;
}

// Driver codes that mean the database cannot be reached rather than that the request was wrong.
const DATABASE_DOWN_CODES = new Set(['ECONNREFUSED', 'PROTOCOL_CONNECTION_LOST', 'ETIMEDOUT', 'ECONNRESET', 'ER_CON_COUNT_ERROR', 'EHOSTUNREACH']);

function isDatabaseDown(error: unknown): boolean {
  let current: unknown = error;
  for (let depth = 0; current && depth < 4; depth++) {
    const code = (current as { code?: unknown }).code;
    if (typeof code === 'string' && DATABASE_DOWN_CODES.has(code)) return true;
    current = (current as { cause?: unknown }).cause;
  }
  return false;
}

/** The one place errors become responses: 400 for bad input, the HttpError's own status, 503 when the database is down, else 500. */
export const errorHandler: ErrorRequestHandler = (error, _req, res, _next) => {
  if (error instanceof ZodError) {
    const fieldErrors = flattenZodError(error);
    const first = Object.entries(fieldErrors)[0];
    res.status(400).json({ error: { code: 'invalid_input', message: first ? `${first[0]}: ${first[1][0]}` : 'The request is not valid.', fieldErrors } });
    return;
  }
  if (error instanceof HttpError) {
    res.status(error.status).json({ error: { code: error.code, message: error.message, ...(error.fieldErrors ? { fieldErrors: error.fieldErrors } : {}) } });
    return;
  }
  if ((error as { type?: string }).type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'invalid_json', message: 'The request body is not valid JSON.' } });
    return;
  }
  if ((error as { type?: string }).type === 'entity.too.large') {
    res.status(413).json({ error: { code: 'too_large', message: 'The request is larger than the server takes (2 MB). For a lab file, split it or remove columns you do not need; nothing was saved.' } });
    return;
  }
  if (isDatabaseDown(error)) {
    res.status(503).json({ error: { code: 'database_unavailable', message: 'The database is not answering. Nothing was changed; try again in a minute.' } });
    return;
  }
  console.error(error);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server. Nothing was changed.' } });
};

/** Unknown /api paths answer in JSON, never with the web app's HTML. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.originalUrl}.` } });
};
