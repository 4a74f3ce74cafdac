/**
 * The demo app in a process of its own, for the server benchmark: boots the real app on a free
 * loopback port over a fresh demo database, prints `{"url": …}` and runs until its stdin closes.
 */
import { startTestServer } from '../../support/server';

const srv = await startTestServer({ auth: { loginLimitPerPair: 1e6, loginLimitPerAddress: 1e6 } });
process.stdout.write(`${JSON.stringify({ url: srv.url })}\n`);
process.stdin.resume();
process.stdin.on('end', () => {
  void srv.stop().then(() => process.exit(0));
});
