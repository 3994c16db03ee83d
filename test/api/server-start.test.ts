// A second server on a port that is already taken must fail with a clear message, never claim
// to be running.
import net from 'node:net';
import { startServer } from '../../server/main';
import { closeTestApp } from '../support/api';

afterAll(closeTestApp);

describe('starting the server', () => {
  it('when the port is already in use, then start-up fails saying so', async () => {
    process.env.STEPSTOCK_NO_BACKGROUND = '1';
    const blocker = net.createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', () => resolve()));
    const port = (blocker.address() as net.AddressInfo).port;
    try {
      await expect(startServer(port, '127.0.0.1')).rejects.toThrow(
        `Port ${port} on 127.0.0.1 is already in use`,
      );
    } finally {
      await new Promise<void>((resolve) => blocker.close(() => resolve()));
      delete process.env.STEPSTOCK_NO_BACKGROUND;
    }
  });
});
