// Asks the API's trivial route every 50 ms from a process of its own (so the work being measured
// beside it cannot delay the asking) until told to stop; answers the latencies over IPC.
import http from 'node:http';

const port = Number(process.argv[2]);
const agent = new http.Agent({ keepAlive: true });
const ms: number[] = [];
let running = true;
const once = () =>
  new Promise<void>((resolve) => {
    const started = performance.now();
    const req = http.get({ host: '127.0.0.1', port, path: '/api/health/live', agent }, (res) => {
      res.resume();
      res.on('end', () => {
        ms.push(performance.now() - started);
        resolve();
      });
    });
    req.on('error', () => resolve());
  });
(async () => {
  process.send?.({ ready: true });
  while (running) {
    await once();
    await new Promise((r) => setTimeout(r, 50));
  }
})();
process.on('message', (m: { ask?: string }) => {
  if (m.ask === 'stop') {
    running = false;
    process.send?.({ ms });
    setTimeout(() => process.exit(0), 100);
  }
});
