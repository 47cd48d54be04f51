import { DrizzleMySQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia } from 'lucia';

import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';

/** Session cookie name; also read by the browser tests. */
export const SESSION_COOKIE = 'troughline_session';

export function createLucia(db: Db, { secureCookies }: { secureCookies: boolean }) {
  const adapter = new DrizzleMySQLAdapter(db as never, sessions, users);
  return new Lucia(adapter, {
    sessionCookie: {
      name: SESSION_COOKIE,
      // HttpOnly and SameSite=Lax are lucia's defaults; Secure only over https so local http works.
      attributes: { secure: secureCookies, sameSite: 'lax' },
    },
    getUserAttributes: (attributes) => ({ email: attributes.email, name: attributes.name }),
    getSessionAttributes: (attributes) => ({ activeOrganizationId: attributes.activeOrganizationId }),
  });
}

export type TroughlineLucia = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: TroughlineLucia;
    DatabaseUserAttributes: { email: string; name: string };
    DatabaseSessionAttributes: { activeOrganizationId: number | null };
  }
}
