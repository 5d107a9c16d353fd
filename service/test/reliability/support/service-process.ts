import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { join } from 'node:path';
import { serviceDir } from './env.js';

/** A free TCP port on 127.0.0.1 (asked of the kernel, then released). */
export function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const s = createServer();
    s.unref();
    s.on('error', rej);
    s.listen(0, '127.0.0.1', () => {
      const a = s.address();
      s.close(() => (a && typeof a === 'object' ? res(a.port) : rej(new Error('no port'))));
    });
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * The built service (node dist/main.js) as a child process of the test, against a database of its own:
 * started, killed with SIGKILL (no shutdown hooks, no flushing) and started again on the same port.
 */
export class ServiceProcess {
  private child: ChildProcess | null = null;
  private exited: Promise<void> = Promise.resolve();
  private log: string[] = [];
  /** Process ids of every start, in order. */
  readonly pids: number[] = [];
  readonly url: string;

  constructor(private readonly opts: { databaseUrl: string; port: number; env?: Record<string, string> }) {
    this.url = `http://127.0.0.1:${opts.port}`;
  }

  get running(): boolean {
    return !!this.child && this.child.exitCode === null && this.child.signalCode === null;
  }

  /** The last lines the service wrote (for failure messages). */
  tail(lines = 30): string {
    return this.log.slice(-lines).join('');
  }

  async start(timeoutMs = 90_000): Promise<void> {
    if (this.running) throw new Error('the service is already running');
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      NODE_OPTIONS: '',
      NODE_ENV: 'test',
      DATABASE_URL: this.opts.databaseUrl,
      PORT: String(this.opts.port),
      HOST: '127.0.0.1',
      LOG_LEVEL: 'warn',
      UI_DIST: '/nonexistent',
      ...this.opts.env,
    };
    const child = spawn(process.execPath, [join(serviceDir(), 'dist', 'main.js')], {
      cwd: serviceDir(),
      env,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    this.child = child;
    this.pids.push(child.pid!);
    const keep = (b: Buffer) => {
      this.log.push(b.toString());
      if (this.log.length > 200) this.log.splice(0, this.log.length - 200);
    };
    child.stdout!.on('data', keep);
    child.stderr!.on('data', keep);
    this.exited = new Promise((res) => child.once('exit', () => res()));
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      if (!this.running) throw new Error(`the service ended during start-up:\n${this.tail()}`);
      try {
        const r = await fetch(`${this.url}/api/health`, { signal: AbortSignal.timeout(2000) });
        if (r.status === 200) return;
      } catch {
        /* not listening yet */
      }
      if (Date.now() > deadline) throw new Error(`the service did not answer /api/health within ${timeoutMs} ms:\n${this.tail()}`);
      await sleep(100);
    }
  }

  /** SIGKILL: the process ends at once, mid-request and mid-transaction. */
  async kill(): Promise<void> {
    if (!this.child) return;
    this.child.kill('SIGKILL');
    await this.exited;
    this.child = null;
  }

  /** A clean stop (SIGTERM, then SIGKILL after 10 s). */
  async stop(): Promise<void> {
    if (!this.child || !this.running) return;
    const c = this.child;
    c.kill('SIGTERM');
    const t = setTimeout(() => c.kill('SIGKILL'), 10_000);
    await this.exited;
    clearTimeout(t);
    this.child = null;
  }
}
