/** What GET /api/health answers. Plain types: the client needs no validator for it. */
export type Health = {
  /** The app's version from package.json. */
  version: string;
  /** 'ok' when the database answered a query within the timeout, else 'down'. */
  database: 'ok' | 'down';
  /** Seconds since the server started. */
  uptimeSeconds: number;
};
