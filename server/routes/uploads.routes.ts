import { idParamSchema } from '../../src/contract/hazards';
import { notFound } from '../http/errors';
import { route } from '../http/route';
import { Upload } from '../models';
import type { UploadStore } from '../uploads';

export function uploadRoutes({ uploads }: { uploads: UploadStore }) {
  return [
    route({
      method: 'get',
      path: '/uploads/:id',
      access: 'signed-in',
      params: idParamSchema,
      handler: async ({ params, user, res }) => {
        // Another team's file is "not found", not "forbidden": its existence is not told.
        const upload = await Upload.findOne({ where: { id: params.id, teamId: user!.teamId } });
        if (!upload) throw notFound('No such file.');
        await uploads.send(res, upload);
      },
    }),
  ];
}
