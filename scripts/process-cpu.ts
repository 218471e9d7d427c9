/**
 * CPU time spent by the processes that serve a loopback port, read from Linux's /proc (the
 * benchmarks' per-request cost, which other load on a shared machine hardly changes). Elsewhere,
 * or for processes of another user, it returns null and the benchmark prints a dash.
 */
import { readdirSync, readFileSync, readlinkSync } from 'node:fs';

/** Clock ticks per second of /proc/<pid>/stat's utime and stime (USER_HZ, 100 on Linux). */
const TICKS_PER_SECOND = 100;

const read = (path: string): string | null => {
  try {
    return readFileSync(path, 'utf8');
  } catch {
    return null;
  }
};

/** The socket inodes listening on `port` (IPv4 and IPv6). */
function listeningInodes(port: number): Set<string> {
  const inodes = new Set<string>();
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    for (const line of (read(table) ?? '').split('\n').slice(1)) {
      const cols = line.trim().split(/\s+/);
      if (cols.length < 10) continue;
      const localPort = parseInt(cols[1]!.split(':').at(-1)!, 16);
      // State 0A is LISTEN.
      if (localPort === port && cols[3] === '0A') inodes.add(cols[9]!);
    }
  }
  return inodes;
}

const pids = () => readdirSync('/proc').filter((name) => /^\d+$/.test(name));

/** The process that holds a listening socket on `port`; null when none of ours does. */
export function pidListeningOn(port: number): number | null {
  const inodes = listeningInodes(port);
  if (inodes.size === 0) return null;
  for (const pid of pids()) {
    let fds: string[];
    try {
      fds = readdirSync(`/proc/${pid}/fd`);
    } catch {
      continue;
    }
    for (const fd of fds) {
      try {
        const target = readlinkSync(`/proc/${pid}/fd/${fd}`);
        const inode = /^socket:\[(\d+)\]$/.exec(target)?.[1];
        if (inode && inodes.has(inode)) return Number(pid);
      } catch {
        // The descriptor closed meanwhile.
      }
    }
  }
  return null;
}

/** user + system CPU of one process (all its threads), in ms; null when it is gone. */
function cpuMsOf(pid: number): number | null {
  const stat = read(`/proc/${pid}/stat`);
  if (!stat) return null;
  // The command name may contain spaces; the fields after it are fixed.
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  const utime = Number(fields[11]);
  const stime = Number(fields[12]);
  return ((utime + stime) * 1000) / TICKS_PER_SECOND;
}

function parentOf(pid: string): number | null {
  const stat = read(`/proc/${pid}/stat`);
  if (!stat) return null;
  return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
}

/**
 * A CPU meter of the process serving `port` and, with `children`, of its child processes too
 * (PostgreSQL: one backend per connection under the postmaster). `read()` gives the CPU ms spent
 * so far by the processes alive now.
 */
export function cpuMeter(port: number, options: { children?: boolean } = {}) {
  const pid = pidListeningOn(port);
  if (pid === null) return null;
  return {
    pid,
    read(): number {
      let total = cpuMsOf(pid) ?? 0;
      if (options.children) {
        for (const child of pids()) {
          if (parentOf(child) === pid) total += cpuMsOf(Number(child)) ?? 0;
        }
      }
      return total;
    },
  };
}
