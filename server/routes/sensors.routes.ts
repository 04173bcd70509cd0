import { idParamSchema } from '../../src/contract/hazards';
import {
  SENSOR_WRITERS,
  sensorDataQuerySchema,
  sensorLimitsPatchSchema,
  sensorParamsSchema,
  sensorUploadFieldsSchema,
  type SensorDataDto,
  type SensorDatasetDto,
  type SensorListDto,
} from '../../src/contract/sensors';
import { countReport } from '../../src/domain/count/report';
import { decimateMinMax, rowsAround, sliceColumns } from '../../src/domain/sensors/decimate';
import { summarizeChannel } from '../../src/domain/sensors/summary';
import { sensorTimeline } from '../../src/domain/sensors/timeline';
import type { CountService } from '../counts/service';
import { badRequest, HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import { Count, SensorDataset, Upload, User } from '../models';
import { unpackColumns } from '../sensors/columns';
import { parseSensorCsv } from '../sensors/parse';
import { saveSensorDataset } from '../sensors/store';
import { acceptUpload, singleFileUpload, uploadDto, type UploadStore } from '../uploads';

const TEXT_TYPES = new Set(['text/csv', 'text/plain']);

function datasetDto(d: SensorDataset): SensorDatasetDto {
  const file = uploadDto(d.upload!);
  return {
    id: d.id,
    countId: d.countId as number,
    file: { uploadId: file.id, name: file.name, sizeBytes: file.sizeBytes, sha256: file.sha256, url: file.url },
    timeBase: d.timeBase,
    timeColumn: d.timeColumn,
    rows: d.rowCount,
    tStart: d.tStart,
    tEnd: d.tEnd,
    channels: d.channels.map((c, index) => ({ index, ...c })),
    uploadedBy: d.createdBy ? { userId: d.createdBy.id, name: d.createdBy.name } : null,
    uploadedAt: d.createdAt.toISOString(),
  };
}

const include = [
  { model: Upload, as: 'upload' },
  { model: User, as: 'createdBy', attributes: ['id', 'name'] },
];
/** Everything but the packed readings, for lists and edits. */
const LIGHT = { exclude: ['data'] };

export function sensorRoutes({ counts, uploads }: { counts: CountService; uploads: UploadStore }) {
  async function findCount(teamId: number, id: number): Promise<Count> {
    const row = await Count.findOne({ where: { id, teamId } });
    if (!row) throw notFound('There is no such count.');
    return row;
  }

  async function findDataset(teamId: number, countId: number, id: number, withData = false): Promise<SensorDataset> {
    const row = await SensorDataset.findOne({ where: { id, countId, teamId }, include, ...(withData ? {} : { attributes: LIGHT }) });
    if (!row) throw notFound('There is no such dataset on this count.');
    return row;
  }

  return [
    route({
      method: 'get',
      path: '/counts/:id/sensors',
      access: 'signed-in',
      params: idParamSchema,
      handler: async ({ params, user }): Promise<SensorListDto> => {
        const teamId = user!.teamId;
        const count = await findCount(teamId, params.id);
        const [rows, events] = await Promise.all([
          SensorDataset.findAll({ where: { countId: params.id, teamId }, include, attributes: LIGHT, order: [['id', 'ASC']] }),
          counts.eventsSince(teamId, params.id, 0),
        ]);
        const report = countReport(events as unknown as Parameters<typeof countReport>[0]);
        return { countId: count.id, countName: count.name, datasets: rows.map(datasetDto), timeline: sensorTimeline(report) };
      },
    }),
    route({
      method: 'post',
      path: '/counts/:id/sensors',
      access: SENSOR_WRITERS,
      status: 201,
      params: idParamSchema,
      // Access is checked before the body is read; the file waits in memory until it has been read in full.
      before: [singleFileUpload('file')],
      body: sensorUploadFieldsSchema,
      handler: async ({ req, params, body, user }): Promise<SensorDatasetDto> => {
        const teamId = user!.teamId;
        await findCount(teamId, params.id);
        const file = await acceptUpload(req.file, 'file');
        if (!TEXT_TYPES.has(file.mediaType)) {
          throw new HttpError(415, 'file_type_not_allowed', 'Sensor data must be a CSV file (UTF-8 text, comma-separated, with a header row).', [
            { path: 'file', message: 'Not a CSV file.' },
          ]);
        }
        const t0At = (await counts.get(teamId, params.id)).state.t0At;
        const parsed = await parseSensorCsv(file.bytes, { t0At });
        const byName = new Map(parsed.channels.map((c, i) => [c.name.toLowerCase(), i]));
        const unknown = Object.keys(body.limits).filter((name) => !byName.has(name.toLowerCase()));
        if (unknown.length) {
          throw badRequest(
            `The limits name ${unknown.map((n) => `“${n}”`).join(', ')}, which ${unknown.length === 1 ? 'is not a channel' : 'are not channels'} of this file. Its channels are ${parsed.channels.map((c) => `“${c.name}”`).join(', ')}.`,
            'validation_failed',
            unknown.map((n) => ({ path: `limits.${n}`, message: 'Not a channel of this file.' })),
          );
        }
        const id = await saveSensorDataset(uploads, { teamId, userId: user!.id, countId: params.id, file, parsed, limits: body.limits });
        return datasetDto(await findDataset(teamId, params.id, id));
      },
    }),
    route({
      method: 'get',
      path: '/counts/:id/sensors/:datasetId/data',
      access: 'signed-in',
      params: sensorParamsSchema,
      query: sensorDataQuerySchema,
      handler: async ({ params, query, user }): Promise<SensorDataDto> => {
        const d = await findDataset(user!.teamId, params.id, params.datasetId, true);
        const { t, channels } = unpackColumns(d.data, d.rowCount, d.channels.length);
        const summaries = channels.map((v, i) => summarizeChannel(i, t, v, { low: d.channels[i]!.low, high: d.channels[i]!.high }));
        const windowed = query.from !== undefined || query.to !== undefined;
        const window = { from: query.from ?? -Infinity, to: query.to ?? Infinity };
        const rows = windowed ? sliceColumns({ t, values: channels }, rowsAround(t, window.from, window.to)) : { t, values: channels };
        const out = decimateMinMax(rows, query.maxPoints ?? Infinity);
        return {
          datasetId: d.id,
          rows: d.rowCount,
          points: out.t.length,
          decimated: out.decimated,
          window: windowed ? { from: Math.max(window.from, d.tStart), to: Math.min(window.to, d.tEnd) } : null,
          t: out.t,
          // JSON has no NaN: an empty cell goes out as null, which the plot draws as a gap.
          values: out.values.map((v) => v.map((x) => (Number.isNaN(x) ? null : x))),
          summaries,
        };
      },
    }),
    route({
      method: 'patch',
      path: '/counts/:id/sensors/:datasetId',
      access: SENSOR_WRITERS,
      params: sensorParamsSchema,
      body: sensorLimitsPatchSchema,
      handler: async ({ params, body, user }): Promise<SensorDatasetDto> => {
        const d = await findDataset(user!.teamId, params.id, params.datasetId);
        const channels = d.channels.map((c) => ({ ...c }));
        const problems: { path: string; message: string }[] = [];
        body.channels.forEach((change, i) => {
          const c = channels[change.index];
          if (!c) {
            problems.push({ path: `channels.${i}.index`, message: `This dataset has ${channels.length} channels, numbered from 0.` });
            return;
          }
          if (change.unit !== undefined) c.unit = change.unit;
          if (change.low !== undefined) c.low = change.low;
          if (change.high !== undefined) c.high = change.high;
          if (c.low !== null && c.high !== null && c.low >= c.high) problems.push({ path: `channels.${i}.high`, message: `For ${c.name}, the high limit must be above the low limit (${c.low}).` });
        });
        if (problems.length) throw badRequest('Some limits cannot be set.', 'validation_failed', problems);
        d.channels = channels;
        await d.save({ fields: ['channels'] });
        return datasetDto(await findDataset(user!.teamId, params.id, params.datasetId));
      },
    }),
    route({
      method: 'delete',
      path: '/counts/:id/sensors/:datasetId',
      access: SENSOR_WRITERS,
      params: sensorParamsSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        await findDataset(teamId, params.id, params.datasetId);
        await uploads.transaction(async ({ transaction }) => {
          const d = await SensorDataset.findOne({ where: { id: params.datasetId, countId: params.id, teamId }, attributes: LIGHT, include: [{ model: Upload, as: 'upload' }], transaction });
          if (!d) throw notFound('There is no such dataset on this count.');
          const upload = d.upload!;
          await d.destroy({ transaction });
          await uploads.remove(upload, transaction);
        });
      },
    }),
  ];
}
