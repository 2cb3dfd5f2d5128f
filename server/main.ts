import { ConfigError } from './config';
import { DEMO_PASSWORD, DEMO_SIGN_INS } from './seed/demo-seed';
import { startStanceline } from './start';

try {
  const app = await startStanceline();
  console.log(`Stanceline is running at ${app.url}`);
  console.log(`Demo sign-ins (password "${DEMO_PASSWORD}"): ${DEMO_SIGN_INS.join(', ')}`);
  const stop = () => {
    app.close().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
} catch (error) {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
}
