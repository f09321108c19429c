import { createApp } from './app.factory';
import { loadConfig } from './config';

async function main(): Promise<void> {
  const cfg = loadConfig();
  const { app } = await createApp(cfg);
  await app.listen(cfg.PORT, cfg.HOST);
  console.log(`Yokeline API listening on http://${cfg.HOST}:${cfg.PORT}`);
}

main().catch((err: unknown) => {
  console.error('Yokeline failed to start:', err);
  process.exit(1);
});
