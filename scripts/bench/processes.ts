/**
 * Child processes for the servers under test, and what /proc says about them (Linux only): the
 * bench reads memory and CPU from outside, so the servers carry no measuring code and the load
 * generator never shares their event loop.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';

/** Linux reports CPU times in clock ticks of 1/100 s (USER_HZ) on every common architecture. */
const TICKS_PER_S = 100;

export interface Child {
  pid: number;
  /** SIGTERM, then SIGKILL if it has not exited after `graceMs`. */
  stop(graceMs?: number): Promise<void>;
}

/**
 * The Node flags npm start gives the server (scripts/server-node-flags: one per line, `#`
 * comments), so the bench runs the server as npm start does.
 */
export function serverNodeFlags(file = 'scripts/server-node-flags'): string[] {
  return fs
    .readFileSync(file, 'utf8')
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line !== '' && !line.startsWith('#'));
}

/** A free loopback port: listen on 0, read the port, close. */
export async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

/**
 * Starts `node [--import tsx] <entry>` (not the tsx CLI, which would put a wrapper process between
 * us and the server and hide its memory) and resolves once a stdout line matches `ready`.
 */
export async function startNodeChild(opts: {
  entry: string;
  args?: string[];
  nodeArgs?: string[];
  env: NodeJS.ProcessEnv;
  ready: RegExp;
  timeoutMs?: number;
}): Promise<Child> {
  const child = spawn(
    process.execPath,
    [
      ...(opts.nodeArgs ?? []),
      // A bundled entry (.mjs) runs on plain node, as npm start runs the server.
      ...(opts.entry.endsWith('.mjs') ? [] : ['--import', 'tsx']),
      opts.entry,
      ...(opts.args ?? []),
    ],
    { env: opts.env, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  let output = '';
  child.stderr!.on('data', (chunk: Buffer) => {
    output += chunk.toString();
    process.stderr.write(chunk);
  });
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(
      () => reject(new Error(`${opts.entry} did not start in time:\n${output}`)),
      opts.timeoutMs ?? 30_000,
    );
    // Read stdout only until the ready line: the server then writes a log line per request, and
    // keeping (and scanning) all of it would cost the load generator's CPU and memory.
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      if (opts.ready.test(output)) {
        clearTimeout(timer);
        child.stdout!.off('data', onData);
        resolve();
      }
    };
    child.stdout!.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`${opts.entry} exited with ${code} before it was ready:\n${output}`));
    });
  });
  // Keep draining stdout so a chatty child never blocks on a full pipe.
  child.stdout!.resume();
  // If the bench itself dies, its servers must not live on.
  const orphanGuard = () => child.kill('SIGKILL');
  process.once('exit', orphanGuard);
  child.once('exit', () => process.off('exit', orphanGuard));
  return { pid: child.pid!, stop: (graceMs) => stopChild(child, graceMs) };
}

async function stopChild(child: ChildProcess, graceMs = 10_000): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  child.kill('SIGTERM');
  const timer = setTimeout(() => child.kill('SIGKILL'), graceMs);
  await exited;
  clearTimeout(timer);
}

function readStatus(pid: number): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const line of fs.readFileSync(`/proc/${pid}/status`, 'utf8').split('\n')) {
    const colon = line.indexOf(':');
    if (colon > 0) fields[line.slice(0, colon)] = line.slice(colon + 1).trim();
  }
  return fields;
}

const kbToMb = (kb: string | undefined) => Number.parseInt(kb ?? '0', 10) / 1024;

/** Resident memory now and its peak since the process started (VmHWM), in MiB. */
export function memoryOf(pid: number): { rssMb: number; peakRssMb: number } {
  const status = readStatus(pid);
  return { rssMb: kbToMb(status.VmRSS), peakRssMb: kbToMb(status.VmHWM) };
}

/** User + system CPU seconds a process has used so far; 0 once it is gone. */
export function cpuSecondsOf(pid: number): number {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name may hold spaces and parentheses: count fields after the last ')'.
    const rest = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(rest[11]) + Number(rest[12])) / TICKS_PER_S;
  } catch {
    return 0;
  }
}

/** Busy and total CPU seconds of the whole machine (all cores), from /proc/stat. */
export function machineCpuSeconds(): { busyS: number; totalS: number } {
  const line = fs.readFileSync('/proc/stat', 'utf8').split('\n')[0]!;
  const ticks = line.trim().split(/\s+/).slice(1).map(Number);
  const total = ticks.reduce((a, b) => a + b, 0);
  // idle and iowait are the fourth and fifth values.
  const idle = (ticks[3] ?? 0) + (ticks[4] ?? 0);
  return { busyS: (total - idle) / TICKS_PER_S, totalS: total / TICKS_PER_S };
}

/** The bench PostgreSQL's processes: its postmaster (found by port) and the postmaster's children. */
export function postgresPids(port: number): number[] {
  const all = fs.readdirSync('/proc').filter((name) => /^\d+$/.test(name));
  const flag = `\0-p\0${port}\0`;
  const postmaster = all.find((pid) => {
    try {
      return `${fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8')}\0`.includes(flag);
    } catch {
      return false;
    }
  });
  if (!postmaster) return [];
  const children = all.filter((pid) => {
    try {
      const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
      return stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1] === postmaster;
    } catch {
      return false;
    }
  });
  return [postmaster, ...children].map(Number);
}
