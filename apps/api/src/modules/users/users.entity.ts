import { EntitySchema } from 'typeorm';

/** A person who can sign in. Platform admin is a flag here; shop roles live in memberships. */
export interface User {
  id: string;
  /** Always stored in lower case; unique. */
  email: string;
  name: string;
  /** argon2id PHC string. */
  passwordHash: string;
  isPlatformAdmin: boolean;
  isActive: boolean;
  createdAt: Date;
}

// EntitySchema instead of decorators: tsx/esbuild cannot emit decorator metadata.
export const UserEntity = new EntitySchema<User>({
  name: 'User',
  tableName: 'users',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    email: { type: 'varchar', length: 254, unique: true },
    name: { type: 'varchar', length: 200 },
    passwordHash: { type: 'varchar', length: 255, name: 'password_hash' },
    isPlatformAdmin: { type: 'boolean', name: 'is_platform_admin', default: false },
    isActive: { type: 'boolean', name: 'is_active', default: true },
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});
