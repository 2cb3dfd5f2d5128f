import { existsSync } from 'node:fs';

// util-linux's setpriv (part of every Debian system) can ask the kernel to kill a child when its
// parent dies, which a plain spawn cannot: without it, an ffmpeg encode outlives a crashed server.
const SETPRIV = '/usr/bin/setpriv';
const hasSetpriv = process.platform === 'linux' && existsSync(SETPRIV);

/**
 * The command line that runs `file args` as a child that dies with this process (SIGKILL on the
 * parent's death) where the system allows it, and as given elsewhere.
 */
export function diesWithParent(file: string, args: readonly string[]): [string, string[]] {
  return hasSetpriv ? [SETPRIV, ['--pdeathsig', 'SIGKILL', '--', file, ...args]] : [file, [...args]];
}
