import { EntitySchema } from 'typeorm';

/** A server-side session. The id is the SHA-256 (hex) of the random token in the cookie. */
export interface Session {
  id: string;
  userId: string;
  /** The shop the person is working in; always one they are a member of (composite FK). */
  activeShopId: string | null;
  createdAt: Date;
  lastSeenAt: Date;
  /** Absolute end of the session, however active it is. */
  expiresAt: Date;
  ip: string | null;
  userAgent: string | null;
}

export const SessionEntity = new EntitySchema<Session>({
  name: 'Session',
  tableName: 'sessions',
  columns: {
    id: { type: 'varchar', length: 64, primary: true },
    userId: { type: 'varchar', length: 36, name: 'user_id' },
    activeShopId: { type: 'varchar', length: 36, name: 'active_shop_id', nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    lastSeenAt: { type: 'datetime', name: 'last_seen_at' },
    expiresAt: { type: 'datetime', name: 'expires_at' },
    ip: { type: 'varchar', length: 64, nullable: true },
    userAgent: { type: 'varchar', length: 512, name: 'user_agent', nullable: true },
  },
});

/** A single-use password reset token; the id is the SHA-256 (hex) of the token in the e-mail. */
export interface PasswordResetToken {
  id: string;
  userId: string;
  createdAt: Date;
  expiresAt: Date;
  usedAt: Date | null;
}

export const PasswordResetTokenEntity = new EntitySchema<PasswordResetToken>({
  name: 'PasswordResetToken',
  tableName: 'password_reset_tokens',
  columns: {
    id: { type: 'varchar', length: 64, primary: true },
    userId: { type: 'varchar', length: 36, name: 'user_id' },
    createdAt: { type: 'datetime', name: 'created_at' },
    expiresAt: { type: 'datetime', name: 'expires_at' },
    usedAt: { type: 'datetime', name: 'used_at', nullable: true },
  },
});
