import { execFileSync } from 'node:child_process';

/** A loopback port with nothing listening on it (asked of the OS in a child process, synchronously). */
export function freePortSync(): number {
  const out = execFileSync(
    process.execPath,
    ['-e', "const s=require('net').createServer().listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})"],
    { encoding: 'utf8' },
  );
  return Number(out.trim());
}
