// Runs bcrypt in a worker thread: a password hash costs tens of milliseconds of CPU, and on the
// main thread a burst of sign-ins would hold every other request (health included) behind it.
// Plain CommonJS so it loads the same under tsx, jest and plain node.
const { parentPort } = require('node:worker_threads');
const bcrypt = require('bcryptjs');

parentPort.on('message', (job) => {
  try {
    const result =
      job.op === 'hash'
        ? bcrypt.hashSync(job.plain, job.cost)
        : bcrypt.compareSync(job.plain, job.hash);
    parentPort.postMessage({ id: job.id, result });
  } catch (err) {
    parentPort.postMessage({ id: job.id, error: err instanceof Error ? err.message : String(err) });
  }
});
