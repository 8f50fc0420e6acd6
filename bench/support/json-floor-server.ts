/**
 * Calibration for the JSON ingest figures (bench/ingest.bench.ts): the least an Express endpoint can do
 * with a JSON batch on this machine — express.json() parses the whole body, the readings of a
 * `{"values": [...]}` batch become a Float32Array (those of a `{"t": [...], "a": [...]}` batch a
 * Float32Array and its times a Float64Array), and the answer says how many there were. No
 * authentication, rate limits, security headers, logging, validation, summaries or storage. Run as its
 * own process: `node --import tsx bench/support/json-floor-server.ts <port>`; prints "listening" when ready.
 */
import express from 'express';

const port = Number(process.argv[2]);
const app = express();
app.use(express.json({ limit: '64mb' }));
app.post('/api/v1/floor', (req, res) => {
  const body = req.body as { values?: number[]; t?: number[]; a?: number[] };
  const values = new Float32Array(body.values ?? body.a ?? []);
  const times = new Float64Array(body.t ?? []);
  res.json({ accepted: values.length, times: times.length });
});
app.listen(port, '127.0.0.1', () => console.log('listening'));
