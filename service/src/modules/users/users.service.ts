import { BadRequestException, ConflictException, Injectable, NotFoundException, UnauthorizedException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, IsNull, Repository } from 'typeorm';
import { ROLE_LABELS, type CrewMemberSummary, type Role, type UnitSystem, type UserSummary } from '@crankjournal/shared-types';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { newSecret, sha256 } from '../../common/util/password.util.js';
import { UserEvents } from '../../common/events/user-events.js';
import { MailService } from '../mail/mail.service.js';
import { ClusterService } from '../cluster/cluster.service.js';
import { AppConfig } from '../../config/app-config.service.js';
import { Invitation } from './invitation.entity.js';
import { User } from './user.entity.js';
import type { InviteUserDto } from './dto/invite-user.dto.js';
import type { UpdateUserDto } from './dto/update-user.dto.js';

const INVITATION_TTL_HOURS = 72;
/** Auth lookups are cached briefly; any change to a user clears the entry at once. */
const AUTH_CACHE_MS = 5_000;

/** A person as other modules see them (no secrets). */
export interface UserRecord {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  active: boolean;
  unitSystem: UnitSystem;
}

/** A person with the password and signing-PIN hashes, for the sign-in checks of the auth module. */
export interface UserWithSecrets extends UserRecord {
  sessionVersion: number;
  passwordHash: string | null;
  pinHash: string | null;
}

@Injectable()
export class UsersService {
  private readonly authCache = new Map<string, { user: AuthUser | null; at: number }>();

  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    @InjectRepository(Invitation) private readonly invitations: Repository<Invitation>,
    private readonly mail: MailService,
    private readonly config: AppConfig,
    private readonly events: UserEvents,
    private readonly cluster: ClusterService,
  ) {
    cluster.on('user', (id) => (id ? this.authCache.delete(id) : this.authCache.clear()));
  }

  async findActiveAuthUser(id: string): Promise<AuthUser | null> {
    const hit = this.authCache.get(id);
    if (hit && Date.now() - hit.at < AUTH_CACHE_MS) return hit.user;
    const u = await this.users.findOne({ where: { id, active: true } });
    const user = u ? { id: u.id, email: u.email, displayName: u.displayName, role: u.role, sessionVersion: u.sessionVersion } : null;
    this.authCache.set(id, { user, at: Date.now() });
    return user;
  }

  /**
   * The person behind a token or socket, now: active, and of the session version the token carries (a token
   * without one counts as version 1, the first). From the same short cache as every request, cleared on any change.
   */
  async currentSessionUser(id: string, sessionVersion: number | undefined): Promise<AuthUser | null> {
    const user = await this.findActiveAuthUser(id);
    return user && user.sessionVersion === (sessionVersion ?? 1) ? user : null;
  }

  /**
   * The person behind a live socket, checked again for each event like each HTTP request: still active, same session
   * version, and the role as it is now. A socket whose session ended is disconnected and the event refused (401).
   */
  async socketUser(socket: { data: { user: AuthUser }; disconnect(close?: boolean): unknown }): Promise<AuthUser> {
    const user = await this.currentSessionUser(socket.data.user.id, socket.data.user.sessionVersion);
    if (!user) {
      socket.disconnect(true);
      throw new UnauthorizedException('This sign-in has ended. Please sign in again.');
    }
    socket.data.user = user;
    return user;
  }

  /** Ends every session of the person: their access tokens stop working and their live connections close at once. */
  async endSessions(id: string): Promise<void> {
    await this.users.increment({ id }, 'sessionVersion', 1);
    this.forget(id);
    this.events.announce('sessionsEnded', id);
  }

  /**
   * Display names of several people in one query, for the modules that show who did what
   * (they never read the users table themselves). Unknown ids are absent from the map.
   */
  async displayNames(ids: Iterable<string | null | undefined>): Promise<Map<string, string>> {
    const wanted = [...new Set([...ids].filter((id): id is string => typeof id === 'string' && id.length > 0))];
    if (wanted.length === 0) return new Map();
    const rows = await this.users.find({ select: { id: true, displayName: true }, where: { id: In(wanted) } });
    return new Map(rows.map((u) => [u.id, u.displayName]));
  }

  /** Drops the cached person here and in every other instance (role, session version, name changed). */
  forget(id: string) {
    this.authCache.delete(id);
    void this.cluster.announce('user', id).catch(() => undefined);
  }

  findByEmailWithSecrets(email: string): Promise<UserWithSecrets | null> {
    return this.users
      .createQueryBuilder('u')
      .addSelect(['u.passwordHash', 'u.pinHash'])
      .where('u.email = :email', { email: email.trim().toLowerCase() })
      .getOne();
  }

  findByIdWithSecrets(id: string): Promise<UserWithSecrets | null> {
    return this.entityWithSecrets(id);
  }

  private entityWithSecrets(id: string): Promise<User | null> {
    return this.users.createQueryBuilder('u').addSelect(['u.passwordHash', 'u.pinHash']).where('u.id = :id', { id }).getOne();
  }

  async get(id: string): Promise<UserRecord> {
    return this.entity(id);
  }

  private async entity(id: string): Promise<User> {
    const u = await this.users.findOne({ where: { id } });
    if (!u) throw new NotFoundException('No such user.');
    return u;
  }

  async list(): Promise<UserSummary[]> {
    const rows = await this.users.createQueryBuilder('u').addSelect('u.passwordHash').orderBy('u.displayName', 'ASC').getMany();
    return rows.map((u) => this.toSummary(u));
  }

  async crew(): Promise<CrewMemberSummary[]> {
    const rows = await this.users.find({ where: { active: true }, order: { displayName: 'ASC' } });
    return rows.map((u) => ({ id: u.id, displayName: u.displayName, role: u.role }));
  }

  private toSummary(u: User): UserSummary {
    return {
      id: u.id,
      email: u.email,
      displayName: u.displayName,
      role: u.role,
      active: u.active,
      unitSystem: u.unitSystem,
      invitationPending: !u.passwordHash,
      createdAt: u.createdAt.toISOString(),
    };
  }

  /** Refuses a display name another active person already has (whatever the case): records must tell people apart. */
  private async assertNameFree(name: string, exceptId?: string) {
    const q = this.users.createQueryBuilder('u').where('lower(u.display_name) = lower(:name)', { name }).andWhere('u.active = true');
    if (exceptId) q.andWhere('u.id <> :exceptId', { exceptId });
    if (await q.getExists())
      throw new ConflictException(`Someone else is already called "${name}". Add an initial or a surname so records tell you apart.`);
  }

  async invite(dto: InviteUserDto, invitedBy: string): Promise<UserSummary> {
    const email = dto.email.trim().toLowerCase();
    await this.assertNameFree(dto.displayName.trim());
    if (await this.users.exists({ where: { email } })) {
      throw new ConflictException(`${email} already has an account.`);
    }
    const { secret, hash } = newSecret();
    const user = await this.users.manager.transaction(async (m) => {
      const u = await m.save(
        m.create(User, { email, displayName: dto.displayName.trim(), role: dto.role, active: true, passwordHash: null }),
      );
      await m.save(
        m.create(Invitation, {
          userId: u.id,
          tokenHash: hash,
          invitedBy,
          expiresAt: new Date(Date.now() + INVITATION_TTL_HOURS * 3600_000),
          usedAt: null,
        }),
      );
      // The invitation e-mail is queued in the same transaction: no invited person without their e-mail, nor the reverse.
      const link = `${this.config.get('PUBLIC_URL')}/set-password?token=${encodeURIComponent(secret)}`;
      await this.mail.send(
        {
          to: email,
          subject: 'Crankjournal: you are invited onto the engine house crew list',
          text: [
            `Hello ${u.displayName},`,
            '',
            `You have been put on the engine house crew list as ${ROLE_LABELS[u.role].toLowerCase()}. ` +
              'Before your first watch, choose a password for the engine log:',
            '',
            link,
            '',
            `The link opens once and lapses after ${INVITATION_TTL_HOURS} hours; if it has lapsed, ask the administrator for a new one.`,
            'Crankjournal keeps the run log, the pre-start checklists and the alarms of the engine.',
            'If nobody told you to expect this, leave it: nothing is set up until a password is chosen.',
          ].join('\n'),
        },
        m,
      );
      return u;
    });
    return this.toSummary(user);
  }

  /** Checks a one-time invitation and marks it used; returns the user. */
  async consumeInvitation(token: string): Promise<UserRecord> {
    const inv = await this.invitations.findOne({ where: { tokenHash: sha256(token) } });
    if (!inv || inv.usedAt || inv.expiresAt.getTime() < Date.now()) {
      throw new BadRequestException('This invitation link is not valid any more. Ask an administrator for a new one.');
    }
    const person = await this.get(inv.userId);
    if (!person.active) throw new BadRequestException('This invitation was withdrawn: the account is not active. Ask an administrator.');
    const res = await this.invitations.update({ id: inv.id, usedAt: IsNull() }, { usedAt: new Date() });
    if (!res.affected) throw new BadRequestException('This invitation link has already been used.');
    return person;
  }

  async setPasswordHash(id: string, passwordHash: string) {
    await this.users.update({ id }, { passwordHash });
    this.forget(id);
  }

  async setPinHash(id: string, pinHash: string) {
    await this.users.update({ id }, { pinHash });
  }

  async update(id: string, dto: UpdateUserDto, actingUserId: string): Promise<UserSummary> {
    const u = await this.entity(id);
    if (id === actingUserId && (dto.active === false || (dto.role && dto.role !== u.role))) {
      throw new BadRequestException('You cannot deactivate yourself or change your own role; ask another administrator.');
    }
    const roleChanged = dto.role !== undefined && dto.role !== u.role;
    if (dto.role !== undefined) u.role = dto.role as Role;
    if (dto.active !== undefined) u.active = dto.active;
    if (dto.displayName !== undefined) u.displayName = dto.displayName.trim();
    if (u.active && (dto.displayName !== undefined || dto.active === true)) await this.assertNameFree(u.displayName, u.id);
    await this.users.save(u);
    this.forget(id);
    if (dto.active === false) this.events.announce('deactivated', id);
    if (roleChanged || dto.active === false) await this.endSessions(id);
    const withHash = await this.entityWithSecrets(id);
    return this.toSummary(withHash!);
  }

  async updatePreferences(id: string, prefs: { unitSystem?: UnitSystem; displayName?: string }): Promise<UserRecord> {
    const patch: Partial<User> = {};
    if (prefs.unitSystem) patch.unitSystem = prefs.unitSystem;
    if (prefs.displayName) patch.displayName = prefs.displayName.trim();
    if (patch.displayName) await this.assertNameFree(patch.displayName, id);
    if (Object.keys(patch).length) await this.users.update({ id }, patch);
    this.forget(id);
    return this.get(id);
  }

  /** E-mail addresses of the active people among `ids`, in the order of `ids`. */
  async activeEmails(ids: string[]): Promise<string[]> {
    if (!ids.length) return [];
    const rows = await this.users.find({ where: { id: In(ids), active: true }, select: { id: true, email: true } });
    const byId = new Map(rows.map((u) => [u.id, u.email]));
    return ids.map((id) => byId.get(id)).filter((e): e is string => !!e);
  }

  usersWithRoles(roles: Role[]): Promise<UserRecord[]> {
    return this.users.createQueryBuilder('u').where('u.role IN (:...roles)', { roles }).andWhere('u.active = true').getMany();
  }
}
