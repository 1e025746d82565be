/**
 * Runs a whole process and measures its wall time and peak resident memory: through GNU time -v when
 * /usr/bin/time exists (`apt-get install time`), else by polling VmHWM in /proc/<pid>/status.
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';

export interface Measured {
  wallSeconds: number;
  /**
   * User + system CPU seconds of the process and its children (GNU time only; NaN otherwise). On a
   * shared machine wall time swings with the other load; CPU time much less.
   */
  cpuSeconds: number;
  /** Peak resident set size in MiB; NaN when it could not be read. */
  peakMiB: number;
  exitCode: number;
  stdout: string;
  stderr: string;
}

const GNU_TIME = '/usr/bin/time';
const PEAK = /Maximum resident set size \(kbytes\): (\d+)/;
const USER = /User time \(seconds\): ([\d.]+)/;
const SYSTEM = /System time \(seconds\): ([\d.]+)/;

export function measureProcess(
  command: string,
  args: string[],
  env: NodeJS.ProcessEnv = process.env,
): Promise<Measured> {
  const useTime = existsSync(GNU_TIME);
  const argv = useTime ? ['-v', command, ...args] : args;
  return new Promise((resolve, reject) => {
    const started = process.hrtime.bigint();
    const child = spawn(useTime ? GNU_TIME : command, argv, { env, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    let polledKb = Number.NaN;
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    const poll = useTime
      ? undefined
      : setInterval(() => {
          try {
            const m = /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'));
            if (m) polledKb = Number(m[1]);
          } catch {
            // the process has just ended
          }
        }, 20);
    child.on('error', reject);
    child.on('close', (code) => {
      if (poll) clearInterval(poll);
      const wallSeconds = Number(process.hrtime.bigint() - started) / 1e9;
      const m = useTime ? PEAK.exec(stderr) : null;
      const peakKb = m ? Number(m[1]) : polledKb;
      const user = useTime ? USER.exec(stderr) : null;
      const system = useTime ? SYSTEM.exec(stderr) : null;
      const cpuSeconds = user && system ? Number(user[1]) + Number(system[1]) : Number.NaN;
      resolve({ wallSeconds, cpuSeconds, peakMiB: peakKb / 1024, exitCode: code ?? -1, stdout, stderr });
    });
  });
}

/** Environment that pins numerical libraries to one thread. */
export function singleThreadEnv(): NodeJS.ProcessEnv {
  return { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
}
