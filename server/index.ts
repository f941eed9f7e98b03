// Listens; everything else is built by createApp.
import { createApp } from './app';
import { connectServices } from './services/index';
import { logger } from './lib/logger';

const deps = await connectServices();
const app = createApp(deps);
const server = app.listen(deps.settings.PORT, deps.settings.HOST, () => {
  logger.info(`Sigmaline listening on http://${deps.settings.HOST}:${deps.settings.PORT}`);
});
if (deps.settings.RUN_WORKER_IN_PROCESS === 'true') {
  const { startWorkers } = await import('./jobs/worker');
  await startWorkers(deps);
}
const shutdown = () => {
  server.close(() => {
    Promise.all([app.close(), deps.close()]).finally(() => process.exit(0));
  });
  setTimeout(() => process.exit(0), 8000).unref();
};
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
