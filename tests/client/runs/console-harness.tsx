import type { RunView } from '@shared/schemas/runs';
import { LiveRunConsole } from '../../../client/src/app/routes/run-pages';
import { createLiveStore } from '../../../client/src/features/live/live-store';
import { json, requests, stubFetch } from '../support/fetch-stub';
import { aUser } from '../support/fixtures';
import { renderWithProviders } from '../support/render';

export const OPERATOR = aUser('operator', 'Tomás Reyes', 'tomas.reyes@example.test');
export const COMMANDS = 'POST /api/runs/7/commands';

type Routes = Record<string, Response | Response[] | ((init: RequestInit) => Response)>;

/** The API the console of run 7 talks to: the session (`user`), the run's log (`events`), and any `routes` given. */
export function serveConsole(routes: Routes = {}, user = OPERATOR, events: unknown[] = []) {
  return stubFetch({
    'GET /api/auth/me': json(200, { user, csrfToken: 'session-token' }),
    'GET /api/runs/7/events': json(200, { items: events }),
    ...routes,
  });
}

/** The console over a live store holding `view`, as the run page shows it. */
export function renderConsole(view: RunView) {
  const store = createLiveStore();
  store.setView(view);
  return { store, ...renderWithProviders(<LiveRunConsole store={store} />) };
}

/** The commands the console sent. */
export const sent = (fetchMock: ReturnType<typeof stubFetch>) => requests(fetchMock).filter((r) => r.key === COMMANDS);
