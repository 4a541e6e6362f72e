/**
 * Builds for the dashboard journeys, posted through the real ingestion route as CI would: a project
 * token made by a signed-in lead, and glTF files built in code (the diver fixture of the API tests,
 * with an explicit LINEAR sampler). Also a meshopt-compressed file for the in-browser check.
 */
import { expect, type APIRequestContext } from '@playwright/test';
import { Document, NodeIO } from '@gltf-transform/core';
import { EXTMeshoptCompression } from '@gltf-transform/extensions';
import { meshopt } from '@gltf-transform/functions';
import { MeshoptDecoder, MeshoptEncoder } from 'meshoptimizer';
import { diverDocument, diverGlb, type FixtureDefect } from '../../integration/api-fixtures';
import { demoBuildCount } from './demo-history';

/** A stored build as the builds route answers. */
export interface PostedBuild {
  id: number;
  verdict: 'pass' | 'fail';
  counts: { error: number; waived: number };
}

/**
 * Creates a project API token with the session of `request` (a lead's or an admin's page.request)
 * and returns its secret.
 */
export async function createProjectToken(
  request: APIRequestContext,
  projectSlug: string,
  name: string
): Promise<string> {
  const response = await request.post(`/api/v1/projects/${projectSlug}/tokens`, { data: { name } });
  expect(response.status(), await response.text()).toBe(201);
  return ((await response.json()) as { token: { secret: string } }).token.secret;
}

/** Options of {@link postDiverBuild}. */
export interface DiverBuildOptions {
  assetPath: string;
  branch: string;
  label: string;
  defect?: FixtureDefect;
}

/** Posts one diver asset as a build with the project token `secret`, as the CLI does (multipart `file` + `meta`). */
export async function postDiverBuild(
  baseURL: string,
  projectSlug: string,
  secret: string,
  options: DiverBuildOptions
): Promise<PostedBuild> {
  const form = new FormData();
  form.append('meta', JSON.stringify({ branch: options.branch, label: options.label }));
  const bytes = await diverGlb({ defect: options.defect ?? 'none' });
  form.append('file', new Blob([bytes as BlobPart]), options.assetPath);
  const response = await fetch(`${baseURL}/api/v1/projects/${projectSlug}/builds`, {
    method: 'POST',
    body: form,
    headers: { authorization: `Bearer ${secret}`, origin: baseURL, accept: 'application/json' }
  });
  expect(response.status, await response.clone().text()).toBe(201);
  return ((await response.json()) as { build: PostedBuild }).build;
}

/**
 * The diver as a GLB whose buffers are EXT_meshopt_compression-compressed, with a hemisphere flip
 * at key 2 (a hemisphere-jump warning under the default policy), so a reader that cannot run the
 * meshopt WebAssembly decoder reports the file unreadable instead.
 */
export async function meshoptDiverGlb(): Promise<Uint8Array> {
  await MeshoptEncoder.ready;
  await MeshoptDecoder.ready;
  const document: Document = diverDocument();
  const output = document.getRoot().listAnimations()[0].listSamplers()[0].getOutput()!;
  const keys = output.getArray()!.slice();
  // q and -q are the same rotation (Shoemake 1985); negating key 2 makes two steps change hemisphere.
  for (let component = 8; component < 12; component++) keys[component] = -keys[component];
  output.setArray(keys);
  await document.transform(meshopt({ encoder: MeshoptEncoder, level: 'medium' }));
  const io = new NodeIO()
    .registerExtensions([EXTMeshoptCompression])
    .registerDependencies({ 'meshopt.encoder': MeshoptEncoder, 'meshopt.decoder': MeshoptDecoder });
  return io.writeBinary(document);
}

/**
 * Waits until the e2e server has posted at least the demo history of a project (journeys add
 * builds of their own, so the count may be higher), so baselines stop moving under a test.
 * @param request a request context of a signed-in project member.
 */
export async function waitForDemoBuilds(request: APIRequestContext, projectSlug: string): Promise<void> {
  const expected = demoBuildCount(projectSlug);
  await expect
    .poll(
      async () => {
        const response = await request.get(`/api/v1/projects/${projectSlug}/builds?pageSize=1`);
        return response.ok() ? ((await response.json()) as { total: number }).total : -response.status();
      },
      { message: `the demo history of ${projectSlug} (${expected} builds) is posted`, timeout: 120_000 }
    )
    .toBeGreaterThanOrEqual(expected);
}
