import type { EntityManager } from 'typeorm';
import type { Role } from '@crankjournal/shared-types';
import { User } from '../../modules/users/user.entity.js';
import { hashPassword } from '../../common/util/password.util.js';
import { readSample } from './samples.js';

interface SiteSample {
  demoPassword: string;
  users: { email: string; displayName: string; role: Role }[];
}

/**
 * Demo users, one or more per role, created once: matched by e-mail, an account that exists is left as it is. An
 * administrator's later changes stand (a deactivated demo account stays deactivated, a changed password stays changed).
 */
export async function seedUsers(m: EntityManager): Promise<Map<string, User>> {
  const site = readSample<SiteSample>('site.json');
  const out = new Map<string, User>();
  for (const s of site.users) {
    const existing = await m.getRepository(User).findOne({ where: { email: s.email } });
    const user =
      existing ??
      (await m.save(User, {
        email: s.email,
        displayName: s.displayName,
        role: s.role,
        active: true,
        passwordHash: await hashPassword(site.demoPassword),
      }));
    out.set(s.email, user);
  }
  return out;
}
