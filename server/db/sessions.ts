/**
 * Lucia's database adapter over Knex (sessions and users tables). Sessions carry their creation
 * time as an attribute so that the absolute lifetime can be enforced beside Lucia's idle expiry.
 */
import type { Adapter, DatabaseSession, DatabaseUser } from 'lucia';
import type { Db } from './knex';

interface SessionRow {
  id: string;
  user_id: string;
  expires_at: number;
  created_at: number;
}

const toSession = (r: SessionRow): DatabaseSession => ({
  id: r.id,
  userId: r.user_id,
  expiresAt: new Date(Number(r.expires_at)),
  attributes: { createdAt: Number(r.created_at) },
});

export function createSessionStore(db: Db): Adapter {
  return {
    async getSessionAndUser(sessionId) {
      const row = await db('sessions').where({ id: sessionId }).first<SessionRow | undefined>();
      if (!row) return [null, null];
      const user = await db('users').where({ id: row.user_id }).whereNull('disabled_at').first();
      if (!user) return [null, null];
      const dbUser: DatabaseUser = {
        id: user.id,
        attributes: { email: user.email, displayName: user.display_name },
      };
      return [toSession(row), dbUser];
    },
    async getUserSessions(userId) {
      const rows = await db('sessions').where({ user_id: userId });
      return rows.map(toSession);
    },
    async setSession(session) {
      await db('sessions').insert({
        id: session.id,
        user_id: session.userId,
        expires_at: session.expiresAt.getTime(),
        created_at: session.attributes.createdAt ?? Date.now(),
      });
    },
    async updateSessionExpiration(sessionId, expiresAt) {
      await db('sessions').where({ id: sessionId }).update({ expires_at: expiresAt.getTime() });
    },
    async deleteSession(sessionId) {
      await db('sessions').where({ id: sessionId }).delete();
    },
    async deleteUserSessions(userId) {
      await db('sessions').where({ user_id: userId }).delete();
    },
    async deleteExpiredSessions() {
      await db('sessions').where('expires_at', '<=', Date.now()).delete();
    },
  };
}
