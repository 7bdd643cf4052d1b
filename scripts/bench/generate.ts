/** Writes a simulated capture of `samples` rows (time, current, sync) to a CSV file in 4 MB pieces. */
import { closeSync, existsSync, openSync, statSync, writeSync } from 'node:fs';
import { simulateCranking } from '../../signal/sim/simulate';

export function generateCapture(path: string, samples: number): number {
  if (existsSync(path) && statSync(path).size > samples * 10) return statSync(path).size;
  const durationS = 8;
  const sim = simulateCranking({
    engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] },
    leakPerS: [0, 0, 3, 0],
    channels: ['current', 'sync'],
    durationS,
    sampleRateHz: samples / durationS,
    seed: 9,
  });
  const fd = openSync(path, 'w');
  writeSync(fd, 'Time (s),Starter current [A],Cyl 1 sync [V]\n');
  let buf = '';
  const c = sim.current!;
  const s = sim.sync!;
  for (let i = 0; i < sim.time.length; i++) {
    buf += `${sim.time[i].toFixed(7)},${c[i].toFixed(2)},${s[i].toFixed(2)}\n`;
    if (buf.length > 4_000_000) {
      writeSync(fd, buf);
      buf = '';
    }
  }
  writeSync(fd, buf);
  closeSync(fd);
  return statSync(path).size;
}
