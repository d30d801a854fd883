// Waiting for the demo study's two samples to be processed after a first start.
import type { Client } from '../support/server';

export async function waitForDemoSamples(client: Client): Promise<void> {
  const deadline = Date.now() + 180_000;
  while (Date.now() < deadline) {
    const samples = (await client.get('/api/samples')).body.samples as Array<{ state: string }>;
    if (samples.length === 2 && samples.every((s) => s.state === 'done')) return;
    if (samples.some((s) => s.state === 'failed')) throw new Error(`a demo sample failed: ${JSON.stringify(samples)}`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  throw new Error('the demo samples were not processed in time');
}
