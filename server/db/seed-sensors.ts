/**
 * Invented test-stand data for the demo's completed count of the Kestrel-2 (2 kN, LOX / ethanol-water, about a
 * five-second burn at Marsh End): two files as two recorders would write them, sampled at 100 Hz from T-60 s to
 * T+15 s. The engine recorder writes seconds from T-0; the propellant skid's logger writes UTC timestamps, so the
 * demo shows both time bases. Deterministic: closed-form curves plus a small seeded generator, never Math.random.
 * Every number is invented for the demo; none describes a real engine.
 */
import { createHash } from 'node:crypto';
import { User } from '../models';
import { parseSensorCsv } from '../sensors/parse';
import { saveSensorDataset } from '../sensors/store';
import type { AcceptedFile, UploadStore } from '../uploads';
import { seededRandom } from '../../src/domain/seeded-random';

export interface DemoSensorInput {
  uploads: UploadStore;
  teamId: number;
  countId: number;
  /** Epoch ms of the count's actual T-0. */
  t0At: number;
  /** The count's holds on the same axis (seconds of wall-clock from T-0), e.g. from sensorTimeline(report).holds. */
  holds: readonly { fromT: number; toT: number }[];
  /** Who the files are recorded as uploaded by; default the team's first person with the operator role. */
  userId?: number;
}

const HZ = 100;
const FROM_T = -60;
const TO_T = 15;
export const KESTREL_LIMITS = {
  chamber_pressure: { high: 18 },
  thrust: { high: 2.4 },
  lox_tank_pressure: { high: 27 },
  fuel_tank_pressure: { high: 27 },
} as const;

/** Noise in [-0.5, 0.5) from a seeded generator, so the "noise" is the same on every seed run. */
export function seededNoise(seed: number): () => number {
  const random = seededRandom(seed);
  return () => random() - 0.5;
}

const smooth = (x: number) => (x <= 0 ? 0 : x >= 1 ? 1 : x * x * (3 - 2 * x));

/** Chamber pressure, bar: ignition at T+0.0, 0.3 s rise to 15 bar, cut-off at T+5.0 with a 0.25 s tail. */
export function chamberPressure(t: number): number {
  if (t < 0 || t > 5.25) return 0;
  const rise = smooth(t / 0.3);
  const tail = t > 5 ? 1 - smooth((t - 5) / 0.25) : 1;
  return 15 * rise * tail + (t > 0.3 && t < 5 ? 0.12 * Math.sin(2 * Math.PI * 7 * t) : 0);
}

/** Tank pressure, bar: pressurised from T-40 s over 8 s with a short overshoot, drooping while the engine draws, vented from T+8 s. */
export function tankPressure(t: number, level: number, overshoot: number, holds: readonly { fromT: number; toT: number }[]): number {
  let p = 1 + (level - 1) * smooth((t + 40) / 8);
  // The regulator settles from an overshoot just after pressurisation.
  if (t > -32 && t < -30) p += overshoot * Math.sin((Math.PI * (t + 32)) / 2);
  // While the engine runs the ullage expands faster than the regulator refills it.
  if (t > 0) p -= 1.6 * smooth(t / 5) * (t > 5 ? 1 - smooth((t - 5) / 2) : 1);
  if (t > 8) p = 1 + (p - 1) * (1 - smooth((t - 8) / 5));
  // In a hold the tanks are vented back to a safe pressure and pressurised again after it.
  for (const h of holds) {
    if (t >= h.fromT && t <= h.toT + 8) {
      const down = smooth((t - h.fromT) / 3);
      const up = t > h.toT ? smooth((t - h.toT) / 8) : 0;
      p = p - (p - 1) * down * (1 - up);
    }
  }
  return p;
}

function fixed(x: number, digits: number): string {
  const s = x.toFixed(digits);
  return s === `-${(0).toFixed(digits)}` ? (0).toFixed(digits) : s;
}

/** The two CSV files, as text. */
export function demoSensorCsvs(t0At: number, holds: DemoSensorInput['holds']): { name: string; text: string }[] {
  const engineNoise = seededNoise(0x4b32);
  const tankNoise = seededNoise(0x7e11);
  const engine = ['t_s,chamber_pressure (bar),thrust (kN)'];
  const tanks = ['timestamp,lox_tank_pressure (bar),fuel_tank_pressure (bar)'];
  for (let i = 0; i <= (TO_T - FROM_T) * HZ; i++) {
    const t = FROM_T + i / HZ;
    const pc = Math.max(0, chamberPressure(t) + (t >= 0 && t <= 5.25 ? 0.05 * engineNoise() : 0.01 * engineNoise()));
    // Thrust follows chamber pressure: 2.0 kN at 15 bar (invented).
    const thrust = (pc / 15) * 2.0 + 0.004 * engineNoise();
    engine.push(`${fixed(t, 2)},${fixed(pc, 3)},${fixed(thrust, 4)}`);
    const lox = tankPressure(t, 24, 3.3, holds) + 0.04 * tankNoise();
    const fuel = tankPressure(t, 23, 0.6, holds) + 0.04 * tankNoise();
    tanks.push(`${new Date(t0At + Math.round(t * 1000)).toISOString()},${fixed(lox, 3)},${fixed(fuel, 3)}`);
  }
  return [
    { name: 'kestrel2-engine-recorder.csv', text: engine.join('\n') + '\n' },
    { name: 'kestrel2-propellant-skid.csv', text: tanks.join('\n') + '\n' },
  ];
}

function accepted(name: string, text: string): AcceptedFile {
  const bytes = Buffer.from(text, 'utf8');
  return { bytes, name, mediaType: 'text/csv', extension: 'csv', sizeBytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex') };
}

/** Stores the two demo files on the count, through the same parser and store as an upload. Returns the dataset ids. */
export async function seedDemoSensorData(input: DemoSensorInput): Promise<number[]> {
  let userId = input.userId;
  if (userId === undefined) {
    const people = await User.findAll({ where: { teamId: input.teamId }, order: [['id', 'ASC']] });
    userId = (people.find((p) => p.roles.includes('operator')) ?? people[0])?.id;
    if (userId === undefined) throw new Error('seedDemoSensorData: the team has nobody to record the upload as');
  }
  const ids: number[] = [];
  for (const { name, text } of demoSensorCsvs(input.t0At, input.holds)) {
    const file = accepted(name, text);
    const parsed = await parseSensorCsv(file.bytes, { t0At: input.t0At });
    ids.push(await saveSensorDataset(input.uploads, { teamId: input.teamId, userId, countId: input.countId, file, parsed, limits: KESTREL_LIMITS }));
  }
  return ids;
}
