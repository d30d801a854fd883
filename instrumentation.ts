// Next.js calls register() once when a server starts: the process makes its files private and stamps client
// addresses on requests, and the processing queue starts, so that jobs a stop cut short are requeued and queued
// samples run without waiting for a request; the mailer starts (with the local mail server when no SMTP host is set). Node.js runtime only (worker threads), and never while
// `next build` loads the app.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs' || process.env.NEXT_PHASE === 'phase-production-build') return;
  const { prepareServerProcess } = await import('./lib/config/server-process');
  prepareServerProcess();
  const { jobRunner } = await import('./lib/jobs/runner');
  await jobRunner();
  const { mailer } = await import('./lib/mail/mailer');
  await mailer();
}
