/** People and password resets in PostgreSQL. The only module that touches User and PasswordReset. */
import { Op, fn, col, where, type Transaction } from 'sequelize';
import { PasswordReset, Studio, User } from '../models';

export interface StoredUser {
  id: string;
  email: string;
  name: string;
  studioId: string;
  passwordHash: string;
}

const toStored = (u: User): StoredUser => ({ id: u.id, email: u.email, name: u.name, studioId: u.studioId as string, passwordHash: u.passwordHash });

export async function findUserByEmail(email: string, transaction?: Transaction): Promise<StoredUser | null> {
  const u = await User.findOne({ where: where(fn('lower', col('email')), email.toLowerCase()), transaction });
  return u ? toStored(u) : null;
}

export async function findUserById(id: string): Promise<StoredUser | null> {
  const u = await User.findByPk(id);
  return u ? toStored(u) : null;
}

export async function insertUser(u: { id: string; email: string; name: string; passwordHash: string; studioId: string }, transaction?: Transaction): Promise<StoredUser> {
  return toStored(await User.create(u, { transaction }));
}

export async function updateName(id: string, name: string): Promise<void> {
  await User.update({ name }, { where: { id } });
}

export async function updatePasswordHash(id: string, passwordHash: string, transaction?: Transaction): Promise<void> {
  await User.update({ passwordHash }, { where: { id }, transaction });
}

export async function studioName(id: string): Promise<string> {
  return (await Studio.findByPk(id))?.name ?? '';
}

export async function insertReset(r: { id: string; userId: string; tokenHash: string; expiresAt: Date }): Promise<void> {
  await PasswordReset.create(r);
}

export async function findReset(id: string): Promise<{ userId: string; tokenHash: string; expiresAt: Date; usedAt: Date | null } | null> {
  const r = await PasswordReset.findByPk(id);
  return r ? { userId: r.userId as string, tokenHash: r.tokenHash, expiresAt: r.expiresAt, usedAt: r.usedAt ?? null } : null;
}

/** Marks the reset used if it still is unused and unexpired; false when someone was first (single use). */
export async function consumeReset(id: string, now: Date, transaction: Transaction): Promise<boolean> {
  const [n] = await PasswordReset.update(
    { usedAt: now },
    { where: { id, usedAt: null, expiresAt: { [Op.gt]: now } }, transaction },
  );
  return n > 0;
}

export function transaction<T>(work: (t: Transaction) => Promise<T>): Promise<T> {
  return User.sequelize!.transaction(work);
}
