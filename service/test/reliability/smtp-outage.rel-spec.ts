/**
 * Durable e-mail: the SMTP server is away for 30 s while a high-high alarm is raised. The alarm's e-mail waits in the
 * queue (written in the alarm's own transaction), is tried again with back-off (MAIL_RETRY_DELAY_SECONDS=1 here so
 * the test is short), arrives once when the server is back, and the administrator's job list shows the failed tries.
 */
import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { join } from 'node:path';
import { promisify } from 'node:util';
import type { MailJobDto } from '@crankjournal/shared-types';
import { engineBody } from '../factories/engine.factory.js';
import { fetchJson } from '../utils/signed-in.js';
import { dropDatabase, freshDatabase, serviceDir, siblingDatabaseUrl, withClient } from './support/env.js';
import { MailStandin } from './support/mail-standin.js';
import { freePort, ServiceProcess } from './support/service-process.js';
import { accessToken } from './support/sessions.js';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const runFile = promisify(execFile);
const OUTAGE_MS = 30_000;

describe('an alarm e-mail survives an SMTP outage and is delivered once', () => {
  const dbUrl = siblingDatabaseUrl('smtp');
  const mail = new MailStandin();
  let svc: ServiceProcess;

  beforeAll(async () => {
    await freshDatabase(dbUrl);
    await runFile(process.execPath, [join(serviceDir(), 'dist', 'database', 'migrate.js')], {
      cwd: serviceDir(),
      env: { ...process.env, NODE_OPTIONS: '', DATABASE_URL: dbUrl },
    });
    await mail.start();
    svc = new ServiceProcess({
      databaseUrl: dbUrl,
      port: await freePort(),
      env: {
        SMTP_PORT: String(mail.smtpPort),
        MAIL_RETRY_DELAY_SECONDS: '1',
        MAIL_RETRY_BACKOFF: 'true',
        MAIL_RETRY_LIMIT: '20',
        JOBS_POLL_SECONDS: '0.5',
      },
    });
    await svc.start();
  }, 180_000);

  afterAll(async () => {
    await svc?.stop();
    await mail.stop();
    await dropDatabase(dbUrl);
  }, 60_000);

  it('waits, retries with back-off, arrives once; the job list shows the tries', async () => {
    const people = await withClient(dbUrl, async (c) => {
      const add = async (role: string) =>
        (
          await c.query(`INSERT INTO users (email, display_name, role, active) VALUES ($1, $2, $3, true) RETURNING id, email`, [
            `${role}-${randomUUID()}@e2e.crankjournal.test`,
            `Outage ${role}`,
            role,
          ])
        ).rows[0] as { id: string; email: string };
      return { chief: await add('chief_engineer'), operator: await add('operator'), admin: await add('administrator') };
    });
    const chief = await accessToken(people.chief.id, 'chief_engineer', 7200);
    const operator = await accessToken(people.operator.id, 'operator', 7200);
    const admin = await accessToken(people.admin.id, 'administrator', 7200);
    const api = <T = unknown>(method: string, path: string, token: string, body?: unknown) =>
      fetchJson<T>(svc.url, method, path, token, body);

    const engine = await api<{ id: string; measurementPoints: { id: string; code: string }[] }>(
      'POST',
      '/api/engines',
      chief,
      engineBody(),
    );
    const run = await api<{ id: string }>('POST', '/api/runs', operator, { engineId: engine.id, purpose: 'test', title: 'Outage' });
    await api('POST', `/api/runs/${run.id}/transitions`, operator, { to: 'preparing' });
    const mb = engine.measurementPoints.find((p) => p.code === 'MB')!.id;

    await mail.stop();
    const raisedAt = Date.now();
    const round = await api<{ stored: number; alarmsRaised: number }>('POST', `/api/runs/${run.id}/rounds`, operator, {
      takenAt: new Date().toISOString(),
      readings: [{ clientId: randomUUID(), pointId: mb, value: 150, takenAt: new Date().toISOString() }],
    });
    expect(round).toMatchObject({ stored: 1, alarmsRaised: 1 });

    const jobOf = async () =>
      (await api<MailJobDto[]>('GET', '/api/mail/jobs', admin)).find(
        (j) => j.to.includes(people.chief.email) && /High-high/.test(j.subject),
      );
    // Meanwhile the job waits between tries, each failure on record.
    await sleep(OUTAGE_MS - (Date.now() - raisedAt));
    const during = await jobOf();
    expect(during).toBeDefined();
    expect(['retry', 'active']).toContain(during!.state);
    expect(during!.tries).toBeGreaterThanOrEqual(3);
    expect(during!.completedAt).toBeNull();
    expect(
      await withClient(
        dbUrl,
        async (c) => (await c.query(`SELECT 1 FROM alarms WHERE engine_id = $1 AND priority = 'high_high'`, [engine.id])).rowCount,
      ),
    ).toBe(1);

    await mail.start();
    // With a 1 s first delay doubling at each try, the next try is at most ~32 s away.
    const deadline = Date.now() + 60_000;
    let arrived: { subject: string }[] = [];
    while (Date.now() < deadline && !arrived.length) {
      arrived = (await mail.messagesTo(people.chief.email)).filter((m) => /High-high/.test(m.subject));
      if (!arrived.length) await sleep(250);
    }
    expect(arrived).toHaveLength(1);
    let done = await jobOf();
    for (let i = 0; i < 40 && done?.state !== 'completed'; i++) {
      await sleep(250);
      done = await jobOf();
    }
    expect(done).toMatchObject({ state: 'completed', lastError: null });
    expect(done!.tries).toBeGreaterThan(during!.tries - 1);
    // Sent once: nothing more arrives.
    await sleep(3_000);
    expect((await mail.messagesTo(people.chief.email)).filter((m) => /High-high/.test(m.subject))).toHaveLength(1);
  }, 180_000);
});
