import { startHoldfire } from './bootstrap';
import { ConfigError } from './config';

try {
  const holdfire = await startHoldfire();
  const { port, host, appUrl } = holdfire.config;
  holdfire.httpServer.listen(port, host, () => console.log(`Holdfire is serving ${appUrl} (listening on ${host}:${port})`));
  const stop = () => void holdfire.shutdown().finally(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
} catch (error) {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
}
