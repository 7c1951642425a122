import type { AppContext } from '@server/context';
import { ApiRouter } from '@server/http/router';

export function healthRoutes(ctx: AppContext) {
  const api = new ApiRouter('/api');
  api.get('/health', {
    handle: () => {
      ctx.sqlite.prepare('select 1').get();
      return { ok: true };
    },
  });
  return api;
}
