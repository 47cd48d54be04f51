/** Stale times for react-query, named so no screen carries a magic number. */
export const STALE = {
  SECONDS: { FIFTEEN: 15_000, THIRTY: 30_000 },
  MINUTES: { ONE: 60_000, FIVE: 300_000 },
  INFINITY: Infinity,
} as const;
