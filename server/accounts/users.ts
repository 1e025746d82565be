/** Data access for people's accounts. E-mails arrive already trimmed and lower-cased (shared/auth.ts). */
import { eq } from 'drizzle-orm';
import type { UserDto } from '../../shared/auth';
import { users } from '../db/schema/auth';
import type { Executor } from './executor';

export interface UserRecord extends UserDto {
  passwordHash: string;
}

export async function findUserByEmail(db: Executor, email: string): Promise<UserRecord | null> {
  const rows = await db
    .select({ id: users.id, email: users.email, name: users.name, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.email, email.trim().toLowerCase()))
    .limit(1);
  return rows[0] ?? null;
}

export async function findUserById(db: Executor, id: string): Promise<UserRecord | null> {
  const rows = await db
    .select({ id: users.id, email: users.email, name: users.name, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.id, id))
    .limit(1);
  return rows[0] ?? null;
}

export async function insertUser(db: Executor, user: { email: string; name: string; passwordHash: string }): Promise<UserDto> {
  const [row] = await db
    .insert(users)
    .values({ email: user.email.trim().toLowerCase(), name: user.name, passwordHash: user.passwordHash })
    .returning({ id: users.id, email: users.email, name: users.name });
  return row;
}

export async function setPasswordHash(db: Executor, userId: string, passwordHash: string): Promise<void> {
  await db.update(users).set({ passwordHash }).where(eq(users.id, userId));
}

export function toUserDto(user: UserDto): UserDto {
  return { id: user.id, email: user.email, name: user.name };
}
