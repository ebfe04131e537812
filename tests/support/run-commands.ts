import type { RunView } from '../../shared/schemas/runs';
import type { Client } from './api';

/** The id of the registered instrument with this serial number (the demo kit's, or one a test added). */
export async function instrumentIdBySerial(client: Client, serialNumber: string): Promise<number> {
  const found = (await client.get('/api/instruments')).body.items.find((i: { serialNumber: string }) => i.serialNumber === serialNumber);
  if (!found) throw new Error(`no instrument ${serialNumber} in the register`);
  return found.id;
}

/** Sends a run command quoting the run's current version, as a console does. */
export async function sendRunCommand(client: Client, runId: number, command: object) {
  const view = (await client.get(`/api/runs/${runId}`)).body as RunView;
  return client.post(`/api/runs/${runId}/commands`, { version: view.version, command });
}
