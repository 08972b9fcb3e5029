/**
 * The local services of the test setup (PostgreSQL, S3, identity provider, mail sink) in a process
 * of their own, for the image bench: production has its object store and database elsewhere, so
 * their work is not on the app's thread while it is timed. Prints the environment as one JSON
 * line on stdout, then runs until its stdin closes (the bench ends) and stops them.
 */
import { startLocalServices } from './services';

const services = await startLocalServices('test', () => {});
process.stdout.write(`${JSON.stringify(services.env)}\n`);
let stopping = false;
const stop = async () => {
  if (stopping) return;
  stopping = true;
  await services.stop();
  process.exit(0);
};
process.stdin.on('end', stop);
process.stdin.on('close', stop);
process.stdin.resume();
process.on('SIGTERM', stop);
