import type { EntityManager } from 'typeorm';
import type { Role } from '@crankjournal/shared-types';
import { User } from '../../modules/users/user.entity.js';
import { hashPassword, verifyPassword } from '../../common/util/password.util.js';
import { readSample } from './samples.js';

interface SiteSample {
  demoPassword: string;
  users: { email: string; displayName: string; role: Role }[];
}

/** Demo users, one or more per role. Idempotent: matched by e-mail, updated in place. */
export async function seedUsers(m: EntityManager): Promise<Map<string, User>> {
  const site = readSample<SiteSample>('site.json');
  const out = new Map<string, User>();
  for (const s of site.users) {
    const existing = await m
      .getRepository(User)
      .createQueryBuilder('u')
      .addSelect('u.passwordHash')
      .where('u.email = :e', { e: s.email })
      .getOne();
    const passwordHash =
      existing?.passwordHash && (await verifyPassword(existing.passwordHash, site.demoPassword))
        ? existing.passwordHash
        : await hashPassword(site.demoPassword);
    const user = await m.save(User, {
      ...(existing ?? {}),
      email: s.email,
      displayName: s.displayName,
      role: s.role,
      active: true,
      passwordHash,
    });
    out.set(s.email, user);
  }
  return out;
}
