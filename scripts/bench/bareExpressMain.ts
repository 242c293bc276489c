// The bare Express baseline as its own process, started by `npm run bench`; PORT picks the port.
// From its own file, not the bench's index: the baseline must not load the bench's packages.
import { startBareExpress } from './bareExpress';

const port = Number(process.env.PORT ?? 0);
startBareExpress(port).then((server) => {
  console.log(`bare express listening on ${port}`);
  const stop = () => server.close(() => process.exit(0));
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
});
