import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connect } from 'node:net';
import { repoRoot } from './env.js';
import { freePort } from './service-process.js';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * A mail stand-in of the test's own (ops/standins/mail-inbox.mjs on free ports, messages kept in a directory of its
 * own), which the test can stop and start again on the same ports: an SMTP server that goes away and comes back.
 */
export class MailStandin {
  private child: ChildProcess | null = null;
  private exited: Promise<void> = Promise.resolve();
  private readonly dir = mkdtempSync(join(tmpdir(), 'cj-mail-'));
  smtpPort = 0;
  httpPort = 0;

  get inboxUrl() {
    return `http://127.0.0.1:${this.httpPort}`;
  }

  async start(): Promise<void> {
    if (!this.smtpPort) {
      this.smtpPort = await freePort();
      this.httpPort = await freePort();
    }
    const child = spawn(
      process.execPath,
      [
        join(repoRoot(), 'ops', 'standins', 'mail-inbox.mjs'),
        '--smtp-port',
        String(this.smtpPort),
        '--http-port',
        String(this.httpPort),
        '--dir',
        this.dir,
      ],
      { env: { ...process.env, NODE_OPTIONS: '' }, stdio: 'ignore' },
    );
    this.child = child;
    this.exited = new Promise((res) => child.once('exit', () => res()));
    for (let i = 0; i < 200; i++) {
      if (await listening(this.smtpPort)) return;
      await sleep(50);
    }
    throw new Error('the mail stand-in did not start');
  }

  async stop(): Promise<void> {
    if (!this.child) return;
    this.child.kill('SIGTERM');
    await this.exited;
    this.child = null;
  }

  async messagesTo(to: string): Promise<{ subject: string; receivedAt: string }[]> {
    const res = await fetch(`${this.inboxUrl}/messages?to=${encodeURIComponent(to)}`);
    if (!res.ok) throw new Error(`mail inbox answered ${res.status}`);
    return (await res.json()) as { subject: string; receivedAt: string }[];
  }
}

function listening(port: number): Promise<boolean> {
  return new Promise((res) => {
    const s = connect(port, '127.0.0.1');
    s.once('connect', () => {
      s.destroy();
      res(true);
    });
    s.once('error', () => res(false));
  });
}
