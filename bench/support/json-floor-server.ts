/**
 * Calibration for the JSON ingest figure (bench/ingest.bench.ts): the least an Express endpoint can do
 * with a `{"values": [...]}` batch on this machine — express.json() parses the whole body, the values
 * become a Float32Array, and the answer says how many there were. No authentication, rate limits,
 * security headers, logging, validation, summaries or storage. Run as its own process:
 * `node --import tsx bench/support/json-floor-server.ts <port>`; prints "listening" when ready.
 */
import express from 'express';

const port = Number(process.argv[2]);
const app = express();
app.use(express.json({ limit: '64mb' }));
app.post('/api/v1/floor', (req, res) => {
  const values = new Float32Array((req.body as { values: number[] }).values);
  res.json({ accepted: values.length });
});
app.listen(port, '127.0.0.1', () => console.log('listening'));
