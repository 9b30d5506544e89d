import type { Command } from 'commander';
import { demoSummary, runDemo } from '../demo/run-demo.js';

/**
 * `plotgauge demo [--port n] [--seed n]`: the newcomer's demo (see server/demo/run-demo.ts). Prints
 * the report's address, a sign-in link (the admin token rides in the #fragment, which never reaches the
 * server's logs), a text summary and the time it took, then keeps serving until Ctrl+C.
 */
export function registerDemoCommand(program: Command): void {
  program
    .command('demo')
    .description(
      'start a demo server with a simulated audience of an invented science centre, and print its report',
    )
    .option('--port <port>', 'port to listen on (PORT, default 8080; a busy port falls back to a free one)')
    .option('--seed <seed>', 'seed of the simulated audience', '2031')
    .action(async (flags: { port?: string; seed: string }) => {
      const demo = await runDemo({
        ...(flags.port === undefined ? {} : { port: Number(flags.port) }),
        seed: Number(flags.seed),
      });
      const summary = await demoSummary(demo);
      console.log('');
      console.log(summary);
      console.log(
        `Ready in ${demo.seconds.toFixed(1)} s (${demo.cpuSeconds.toFixed(1)} s of CPU). The server keeps running; press Ctrl+C to stop it.`,
      );
      console.log('');
      console.log(`  Report (open this link to sign in):  ${demo.signInUrl}`);
      console.log(`  Report address:                      ${demo.reportUrl}`);
      console.log(`  Fairness (works with data, yes/no):  ${demo.fairnessUrl}`);
      console.log(
        `  Design check of a planned chart:     npx tsx server/main.ts predict --database ${demo.databaseUrl} --study ${demo.studyId} --chart-type scatter --level interpret --marks 40 --legend yes`,
      );
      console.log(`  Take the test yourself:              ${demo.tryUrl}  (joins the weekend families)`);
      console.log(
        `  The team's console:                  ${new URL('/console', demo.reportUrl).href}  (sign in with the token below)`,
      );
      console.log(`  Admin token (this run only):         ${demo.adminToken}`);
      console.log('');
      await new Promise<void>((resolve) => {
        const stop = () => resolve();
        process.once('SIGINT', stop);
        process.once('SIGTERM', stop);
      });
      await demo.close();
    });
}
