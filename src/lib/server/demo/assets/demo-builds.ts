/**
 * The demo's build history as a pure plan: one entry per CI build of the fictional studio, with
 * commit, branch, author, date and a thunk that generates the build's files. The demo seeder
 * submits each plan through the real ingestion route, so every finding the demo shows comes
 * from the real lint engine reading these generated files.
 */
import { RULE_IDS, type RuleId } from '$lib/lint/rule-ids';
import { toDemoFiles, type DemoFile } from './asset-files';
import { DEMO_ASSETS } from './demo-asset-catalog';
import { DEMO_CI_HOST, DEMO_PROJECT_STORIES, getDemoAuthor, type DemoProjectSlug } from './demo-projects';
import { DEMO_TIMELINE, type TimelineEntry } from './demo-timeline';
import type { DefectName } from './defects';
import { createSeededRandom, randomHex, seedFromText } from './seeded-random';

/** One asset of a build, as the story describes it. */
export interface DemoBuildAsset {
  /** Main file path (`.glb`, or `.gltf` with a `.bin` beside it). */
  path: string;
  title: string;
  revision: number;
  /** Defects injected into this revision, in the order applied. */
  defects: DefectName[];
}

/** One CI build of the demo history. */
export interface DemoBuildPlan {
  project: DemoProjectSlug;
  branch: string;
  /** 40 lowercase hex digits, fixed by the story (not a real commit). */
  commitSha: string;
  /** CI pipeline number as shown in the CI tool, e.g. `#1042`. */
  label: string;
  ciJobUrl: string;
  /** ISO 8601, UTC; strictly increasing through the list. */
  createdAt: string;
  author: string;
  authorEmail: string;
  commitMessage: string;
  /** What the build shows a visitor, one sentence. */
  story: string;
  contents: DemoBuildAsset[];
  /**
   * Rules the injected defects trip under the default policy, in report order (empty for a clean
   * build). Clean dense bakes may add `redundant-keys` info findings of their own.
   */
  expectedRules: RuleId[];
  /** Whether the build has error findings under its project's demo policy ({@link getDemoPolicy}). */
  expectsErrors: boolean;
  /** Generates the build's files: 3 to 8 small files; the same bytes on every call. */
  assets(): Promise<DemoFile[]>;
}

/** Length of the history window: the oldest build is this many days before `baseDate`. */
export const DEMO_WINDOW_DAYS = 30;

/** The first CI pipeline number of the story. */
const FIRST_PIPELINE = 1038;

const DAY_MS = 86_400_000;

/**
 * Lists the demo's builds, oldest first, dated within the {@link DEMO_WINDOW_DAYS} days before
 * `baseDate` (the window starts at UTC midnight, so the last build lands before `baseDate`).
 * Everything except the dates is fixed: no clock and no `Math.random` are involved, so two calls
 * with the same `baseDate` give identical plans and identical file bytes.
 */
export function listDemoBuilds(baseDate: Date = new Date()): DemoBuildPlan[] {
  const windowStartMs = Math.floor(baseDate.getTime() / DAY_MS) * DAY_MS - DEMO_WINDOW_DAYS * DAY_MS;
  const pipelineGaps = createSeededRandom(seedFromText('lanternfish-ci-pipelines'));
  let pipeline = FIRST_PIPELINE;
  return DEMO_TIMELINE.map((entry, index) => {
    pipeline += 1 + Math.floor(pipelineGaps() * 4);
    return toPlan(entry, index, pipeline, windowStartMs);
  });
}

function toPlan(entry: TimelineEntry, index: number, pipeline: number, windowStartMs: number): DemoBuildPlan {
  const project = DEMO_PROJECT_STORIES.find((candidate) => candidate.slug === entry.project);
  if (!project) throw new Error(`Demo timeline entry ${index} names unknown project "${entry.project}".`);
  const branch = entry.branch === 'main' ? 'main' : project.featureBranch;
  const author = getDemoAuthor(entry.author);
  const contents = entry.assets.map((item) => ({
    path: DEMO_ASSETS[item.key].path,
    title: DEMO_ASSETS[item.key].title,
    revision: item.revision,
    defects: item.defects.map((defect) => defect.name)
  }));
  const tripped = new Set(entry.assets.flatMap((item) => item.defects.flatMap((defect) => defect.rules)));
  return {
    project: entry.project,
    branch,
    commitSha: randomHex(createSeededRandom(seedFromText(`${entry.project}:${branch}:${index}`)), 40),
    label: `#${pipeline}`,
    ciJobUrl: `${DEMO_CI_HOST}/tidewatch/${entry.project}/pipelines/${pipeline}`,
    createdAt: new Date(windowStartMs + entry.day * DAY_MS + Math.round(entry.hour * 3_600_000)).toISOString(),
    author: author.name,
    authorEmail: author.email,
    commitMessage: entry.commitMessage,
    story: entry.story,
    contents,
    expectedRules: RULE_IDS.filter((rule) => tripped.has(rule)),
    expectsErrors: entry.hasErrors,
    assets: async () => {
      const files: DemoFile[] = [];
      for (const item of entry.assets) {
        const catalogAsset = DEMO_ASSETS[item.key];
        const document = catalogAsset.create(item.revision);
        for (const defect of item.defects) defect.apply(document);
        files.push(...(await toDemoFiles(document, catalogAsset.path)));
      }
      return files;
    }
  };
}
