import path from 'node:path';
import mysql from 'mysql2/promise';

/**
 * The "faults" instance for e2e/faults.spec.ts: a MariaDB, an S3 stand-in and a second `next start`
 * of the test build (the build `npm test` made for its own app), all of its own (.data/faults/, ports in
 * scripts/lib/instance.mjs), so the spec can kill and restart them while the other specs keep the
 * shared test services. Started with the same scripts as `npm test` (scripts/lib/*.mjs). Only one
 * `npm test` runs per checkout (its lock), so only one spec run ever owns this instance.
 */

const ROOT = path.resolve(__dirname, '..', '..');
const lib = (file: string) => path.join(ROOT, 'scripts', 'lib', file);

// The orchestration scripts are ES modules without types; what the spec uses of them.
interface Instance {
  name: string;
  dir: string;
  dbName: string;
  socket: string;
  appUrl: string;
  s3Url: string;
  s3Dir: string;
  logsDir: string;
  runDir: string;
  mariadbPidFile: string;
}
interface Child {
  pid?: number;
  exitCode: number | null;
  signalCode: string | null;
}
type Env = Record<string, string | undefined>;

async function scripts() {
  const [instance, mariadb, database, s3, nextApp, processes] = await Promise.all([
    import(lib('instance.mjs')),
    import(lib('mariadb.mjs')),
    import(lib('database.mjs')),
    import(lib('s3.mjs')),
    import(lib('next-app.mjs')),
    import(lib('processes.mjs')),
  ]);
  return { instance, mariadb, database, s3, nextApp, processes };
}
type Scripts = Awaited<ReturnType<typeof scripts>>;

export class FaultInstance {
  private mariadbChild: Child | null = null;
  private s3Child: Child | null = null;
  private nextChild: Child | null = null;
  private root: mysql.Connection | null = null;

  private constructor(
    private readonly s: Scripts,
    readonly inst: Instance,
    private readonly env: Env,
  ) {}

  /** Starts MariaDB (a fresh, migrated and seeded database), the S3 stand-in (empty) and the app. */
  static async start(): Promise<FaultInstance> {
    const s = await scripts();
    const inst: Instance = s.instance.getInstance('faults');
    s.instance.prepareDirs(inst);
    // a run killed before its afterAll left these behind
    await s.instance.recoverLeftovers(inst);
    const password: string = s.instance.readOrCreateSecret(path.join(inst.dir, 'db-password'), 18);
    const nextauthSecret: string = s.instance.readOrCreateSecret(path.join(inst.dir, 'nextauth-secret'), 32);
    const env: Env = s.instance.childEnv(inst, {
      databaseUrl: s.mariadb.databaseUrl(inst, password),
      // the app's mail goes to a port nobody listens on, never into the test inbox the other specs read
      mailStandIn: true,
      s3StandIn: true,
      nextauthSecret,
    });
    // the build `npm test` made (and checked current) for its own app
    env.COUPLET_DIST_DIR = process.env.COUPLET_DIST_DIR || '.next-test';
    const faults = new FaultInstance(s, inst, env);
    try {
      await faults.startMariaDb();
      await s.mariadb.ensureDatabase(inst, { password, recreate: true });
      await s.database.migrate(inst, env);
      await s.database.seed(inst, env);
      s.s3.resetS3Dir(inst);
      await faults.startS3();
      faults.nextChild = (await s.nextApp.startNext(inst, env)).child;
    } catch (error) {
      await faults.stop();
      throw error;
    }
    return faults;
  }

  get appUrl(): string {
    return this.inst.appUrl;
  }

  get s3BucketUrl(): string {
    return `${this.inst.s3Url}/${this.s.instance.S3_STAND_IN.bucket}`;
  }

  /** Starts MariaDB on the instance's datadir (crash recovery runs here after a kill). */
  async startMariaDb(): Promise<void> {
    this.mariadbChild = await this.s.mariadb.startMariaDb(this.inst);
  }

  /** SIGKILL: no shutdown, no flush; whatever was not committed must be rolled back at the next start. */
  async killMariaDb(): Promise<void> {
    await this.closeRoot();
    const child = this.mariadbChild;
    if (!child?.pid) throw new Error('MariaDB of the faults instance is not running');
    process.kill(child.pid, 'SIGKILL');
    await this.waitForExit(child, 'mariadbd');
    this.mariadbChild = null;
  }

  async startS3(): Promise<void> {
    this.s3Child = await this.s.s3.startS3(this.inst, this.env);
  }

  /** SIGKILL of the S3 stand-in; its objects stay on disk for the restart. */
  async killS3(): Promise<void> {
    const child = this.s3Child;
    if (!child?.pid) throw new Error('the S3 stand-in of the faults instance is not running');
    process.kill(child.pid, 'SIGKILL');
    await this.waitForExit(child, 'the S3 stand-in');
    this.s3Child = null;
  }

  private async waitForExit(child: Child, what: string): Promise<void> {
    for (let i = 0; i < 100; i++) {
      if (child.exitCode !== null || child.signalCode !== null) return;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    throw new Error(`${what} did not exit within 5 s of SIGKILL`);
  }

  /** Root over the Unix socket (inside the 0700 instance dir), on the instance's database; reconnects after a restart. */
  async sql<T = Record<string, unknown>>(query: string, values: unknown[] = []): Promise<T[]> {
    this.root ??= await this.rootSession();
    const [rows] = await this.root.query(query, values);
    return rows as T[];
  }

  /** A root session of its own, e.g. for a lock held while `sql` keeps watching. */
  async rootSession(): Promise<mysql.Connection> {
    const connection = await mysql.createConnection({ socketPath: this.inst.socket, user: 'root', database: this.inst.dbName, supportBigNumbers: true });
    // the spec kills the server under idle sessions: their "connection lost" is expected, not a crash of the worker
    connection.on('error', () => {});
    return connection;
  }

  private async closeRoot(): Promise<void> {
    const root = this.root;
    this.root = null;
    if (root) root.destroy();
  }

  /** Stops everything still running, app first; safe to call more than once and after a failed start. */
  async stop(): Promise<void> {
    await this.closeRoot();
    const { stopTree, removeFile } = this.s.processes;
    if (this.nextChild?.pid) await stopTree(this.nextChild.pid, { timeoutMs: 15000 });
    this.nextChild = null;
    if (this.s3Child?.pid) await stopTree(this.s3Child.pid, { timeoutMs: 10000 });
    this.s3Child = null;
    // the pid files startNext and startS3 wrote (a later start would find them stale and say so)
    for (const file of ['next.pid', 's3.pid']) removeFile(path.join(this.inst.runDir, file));
    // a clean shutdown, or a pid file left by a server this object lost track of
    await this.s.mariadb.stopMariaDb(this.inst, this.mariadbChild);
    this.mariadbChild = null;
  }
}
