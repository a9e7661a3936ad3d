import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';

/**
 * A real Dask cluster on the loopback interface for tests: `dask scheduler` and `dask worker`
 * (Debian's python3-distributed), each started in its own process group (setsid, via detached)
 * so that stopping it ends every process it started; every wait is bounded.
 */
export class DaskCluster {
  private constructor(
    readonly address: string,
    private readonly scheduler: ChildProcess,
    private readonly workers: ChildProcess,
  ) {}

  static async start(workers = 2): Promise<DaskCluster> {
    if (spawnSync('/usr/bin/python3', ['-c', 'import distributed'], { stdio: 'ignore' }).status !== 0) {
      throw new Error('python3-distributed is missing: install the Debian packages python3-distributed python3-dask');
    }
    const port = await freePort();
    const address = `tcp://127.0.0.1:${port}`;
    const scheduler = spawn('/usr/bin/dask', ['scheduler', '--host', '127.0.0.1', '--port', String(port), '--no-dashboard'], { detached: true, stdio: 'ignore' });
    const pool = spawn('/usr/bin/dask', ['worker', address, '--nworkers', String(workers), '--nthreads', '1', '--no-dashboard'], { detached: true, stdio: 'ignore' });
    const cluster = new DaskCluster(address, scheduler, pool);
    try {
      cluster.python(`c.wait_for_workers(${workers}, timeout=90)`, 120_000);
    } catch (e) {
      cluster.stop();
      throw e;
    }
    return cluster;
  }

  /** Process ids of the worker processes (not their nannies), as the scheduler knows them. */
  workerPids(): number[] {
    const out = this.python(`import os\nprint(json.dumps(list(c.run(os.getpid).values())))`, 30_000);
    return JSON.parse(out.trim().split('\n').pop()!) as number[];
  }

  /** Runs Python with `c`, a Client of this cluster; returns its stdout. */
  python(code: string, timeoutMs: number): string {
    const script = `import json\nfrom distributed import Client\nc = Client("${this.address}", timeout=30)\n${code}\nc.close()\n`;
    const r = spawnSync('/usr/bin/python3', ['-c', script], { encoding: 'utf8', timeout: timeoutMs });
    if (r.status !== 0) throw new Error(`dask client failed: ${r.error?.message ?? ''} ${r.stderr}`);
    return r.stdout;
  }

  stop(): void {
    for (const p of [this.workers, this.scheduler]) {
      try {
        process.kill(-p.pid!, 'SIGKILL');
      } catch {
        // already gone
      }
    }
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}
