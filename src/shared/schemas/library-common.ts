/**
 * Pieces shared by the library contracts: pagination, ids, library choice. zod lives only on the server
 * and in tests; the client imports types from these files, never values.
 */
import { z } from 'zod';

import { LIBRARIES, PAGE_SIZE } from '../library-terms';

/** A positive integer id in a URL. */
export const idParams = z.object({ id: z.coerce.number({ message: 'must be a number' }).int('must be a whole number').positive('must be a positive id') });

/** Page and size of a list; page 1 is the first. */
export const pageQuery = {
  page: z.coerce.number().int().min(1, 'page starts at 1').max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(PAGE_SIZE.max, `at most ${PAGE_SIZE.max} rows a page`).default(PAGE_SIZE.default),
  /** Words to find in names (case-insensitive). */
  search: z.string().trim().max(100, 'search at most 100 characters').optional(),
};

export const libraryQuery = z.enum(LIBRARIES, { message: `library must be one of: ${LIBRARIES.join(', ')}` });

/** True for a calendar date that exists (the date parser rolls 2026-02-30 over to March 2 instead of refusing it). */
export function isRealDate(text: string): boolean {
  const parsed = new Date(`${text}T00:00:00Z`);
  return !Number.isNaN(parsed.getTime()) && parsed.toISOString().slice(0, 10) === text;
}

/** A calendar date, YYYY-MM-DD. */
export const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'use a date like 2026-03-31').refine(isRealDate, 'not a real date: check the day and the month');

/** A page of rows. */
export type Page<T> = { items: T[]; total: number; page: number; pageSize: number };
