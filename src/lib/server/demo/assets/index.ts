/**
 * The demo asset generator's public surface: the build plan the demo seeder posts, the policy
 * each project's story assumes, and the generators and defects behind them for anyone who wants
 * a single Tidewatch asset (tests, benchmarks, screenshots).
 *
 * @example
 * for (const build of listDemoBuilds(new Date())) {
 *   const files = await build.assets(); // [{ path: 'chars/kelp-diver.glb', bytes }, …]
 * }
 */
export { listDemoBuilds, DEMO_WINDOW_DAYS, type DemoBuildPlan, type DemoBuildAsset } from './demo-builds';
export {
  DEMO_CI_HOST,
  DEMO_PROJECT_STORIES,
  getDemoAuthor,
  getDemoPolicy,
  type DemoAuthor,
  type DemoProjectSlug,
  type DemoProjectStory
} from './demo-projects';
export { DEMO_ASSETS, type DemoAsset, type DemoAssetKey } from './demo-asset-catalog';
export { toDemoFiles, toGlb, toGltfFiles, type DemoFile } from './asset-files';
export { createCharacter, type CharacterOptions } from './character';
export { createLighthouseLamp, type LighthouseLampOptions } from './lighthouse-lamp';
export { createDockWindlass, type DockWindlassOptions } from './dock-windlass';
export { createTideBuoy, type TideBuoyOptions } from './tide-buoy';
export { createCameraRig, type CameraRigOptions } from './camera-rig';
export { DEFECTS, DEFECT_RULES, defectStep, type DefectName, type DefectOptions, type DefectStep } from './defects';
export { DemoAssetError } from './demo-asset-error';
