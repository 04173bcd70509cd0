import type { z } from 'zod';
import type { uploadLimitsSchema } from '../../src/contract/sensors';
import { SensorDataset } from '../models';
import type { AcceptedFile, UploadStore } from '../uploads';
import { packColumns } from './columns';
import type { ParsedSensorFile } from './parse';

/**
 * Stores a parsed file: the original through the upload store, the readings packed into the dataset row, in one
 * transaction (a failure leaves neither the file nor the row). Parse before calling: the transaction stays short.
 */
export async function saveSensorDataset(
  uploads: UploadStore,
  input: { teamId: number; userId: number; countId: number; file: AcceptedFile; parsed: ParsedSensorFile; limits?: z.output<typeof uploadLimitsSchema> },
): Promise<number> {
  const { parsed } = input;
  const limits = input.limits ?? {};
  const channels = parsed.channels.map((c) => {
    const key = Object.keys(limits).find((n) => n.toLowerCase() === c.name.toLowerCase());
    const l = key ? limits[key]! : {};
    return { name: c.name, unit: c.unit, low: l.low ?? null, high: l.high ?? null };
  });
  const data = packColumns(
    parsed.t,
    parsed.channels.map((c) => c.values),
  );
  return uploads.transaction(async ({ transaction, save }) => {
    const upload = await save(input.file, { teamId: input.teamId, userId: input.userId });
    const row = await SensorDataset.create(
      {
        teamId: input.teamId,
        countId: input.countId,
        uploadId: upload.id,
        timeBase: parsed.timeBase,
        timeColumn: parsed.timeColumn.slice(0, 80),
        rowCount: parsed.t.length,
        tStart: parsed.t[0]!,
        tEnd: parsed.t[parsed.t.length - 1]!,
        channels,
        data,
        createdById: input.userId,
      },
      { transaction },
    );
    return row.id;
  });
}
