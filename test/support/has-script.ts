/** whether util-linux `script` is here to give a spawned program a pseudo-terminal */
import { execFileSync } from 'node:child_process';

export const HAS_SCRIPT = (() => {
  try {
    execFileSync('script', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
})();
