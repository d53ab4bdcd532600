// Runs once when the server starts (Next's instrumentation hook): starts the outbox worker that
// sends queued e-mail (lib/server/outbox-worker.ts). Only in the Node.js runtime; the worker needs the
// database and SMTP sockets. OUTBOX_WORKER=off leaves it stopped (a test that drives it itself).
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  const { startOutboxWorker } = await import('./lib/server/outbox-worker');
  startOutboxWorker();
}
