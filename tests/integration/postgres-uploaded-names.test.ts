/**
 * Names taken from an uploaded glTF file reach the database unchecked: an animation or node name
 * may be longer than any VARCHAR in the schema, or hold U+0000. PostgreSQL enforces VARCHAR
 * lengths and refuses NUL in text where SQLite takes both, so these builds are the ones that
 * would fail on PostgreSQL only. Runs in both passes: the answer must not depend on the database.
 */
import { WebIO } from '@gltf-transform/core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FindingRecord } from '$lib/server/db/models';
import { diverDocument } from './api-fixtures';
import { postBuild, seedProject, startApiTestServer, type ApiTestServer } from './api-test-server';

let server: ApiTestServer;
let secret: string;

beforeAll(async () => {
  server = await startApiTestServer();
  ({ secret } = await seedProject('tidewatch-names'));
});
afterAll(async () => server?.remove());

/** The diver rig with an all-zero key (a `not-a-rotation` error), its clip and joint renamed. */
async function diverNamed(animationName: string, jointName: string): Promise<Uint8Array> {
  // diverDocument sets LINEAR interpolation on its sampler.
  const document = diverDocument({ defect: 'zero-key', jointName });
  document.getRoot().listAnimations()[0].setName(animationName);
  return new WebIO().writeBinary(document);
}

describe('names from the uploaded file', () => {
  it('stores a finding whose clip name is longer than 255 characters and whose joint path is longer than 1024', async () => {
    const animationName = `Swim-${'a'.repeat(600)}`;
    const jointName = `Hips-${'j'.repeat(2000)}`;
    const response = await postBuild(server, 'tidewatch-names', secret, [
      { path: 'chars/long-names.glb', bytes: await diverNamed(animationName, jointName) }
    ]);
    expect(response.status, await response.clone().text()).toBe(201);
    const { build } = (await response.json()) as { build: { id: number } };
    const findings = await FindingRecord.findAll({ where: { buildId: build.id, rule: 'not-a-rotation' } });
    expect(findings).toHaveLength(1);
    expect(findings[0].animation).toBe(animationName);
    expect(findings[0].node).toContain(jointName);
  });

  it('stores a NUL in a clip or joint name as U+FFFD and still answers the build', async () => {
    const response = await postBuild(
      server,
      'tidewatch-names',
      secret,
      [{ path: 'chars/nul-names.glb', bytes: await diverNamed('Swim\u0000Loop', 'Hips\u0000L') }],
      { branch: 'feature/nul-names' }
    );
    expect(response.status, await response.clone().text()).toBe(201);
    const { build } = (await response.json()) as { build: { id: number } };
    const [finding] = await FindingRecord.findAll({ where: { buildId: build.id, rule: 'not-a-rotation' } });
    expect(finding.animation).toBe('Swim\uFFFDLoop');
    expect(finding.node).toContain('Hips\uFFFDL');
  });
});
