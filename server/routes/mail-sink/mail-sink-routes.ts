import { CapturedMailList } from '../../../shared/schemas/mail';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { readCapturedMail } from '../../mail/mail-sink';

export function mailSinkRoutes(context: AppContext): AnyRouteSpec[] {
  return [
    route({
      method: 'get',
      path: '/mail-sink/messages',
      tag: 'Outbox',
      summary: "Messages caught by the local mail sink (empty and disabled when mail goes to the lab's server)",
      access: ['manager'],
      response: CapturedMailList,
      handler: async () => {
        const dir = context.config.mailSinkDir;
        return dir ? { enabled: true, messages: await readCapturedMail(dir) } : { enabled: false, messages: [] };
      },
    }),
  ];
}
