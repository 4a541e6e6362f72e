/**
 * The demo's studio and projects as the build history needs them: the CI host, each project's
 * feature branch and the rule severities its story assumes. The cast and the projects themselves
 * (names, members, base policy) live in `../demo-accounts.ts`, the one source the seed also reads,
 * so every build author here is a real demo account.
 */
import type { PolicyInput } from '$lib/lint/policy';
import type { RuleId } from '$lib/lint/rule-ids';
import { DEMO_ACCOUNTS, DEMO_PROJECTS } from '../demo-accounts';

/** The fictional studio's CI host (`.example` domains never resolve). */
export const DEMO_CI_HOST = 'https://ci.lanternfish.example';

/** Slugs of the demo projects. */
export type DemoProjectSlug = 'tidewatch-characters' | 'tidewatch-props' | 'tidewatch-cinematics';

/** What the build history adds to a demo project. */
export interface DemoProjectStory {
  slug: DemoProjectSlug;
  /** The branch besides `main` the project's story runs on. */
  featureBranch: string;
  /**
   * Rules the team raises to `error` because its runtime cannot tolerate them, so the default gate
   * (fail on errors, new findings only) stops exactly the builds the story says it stops.
   */
  ruleOverrides: Partial<Record<RuleId, 'error' | 'warning' | 'info' | 'off'>>;
}

/** The three projects' stories, in the order the demo lists the projects. */
export const DEMO_PROJECT_STORIES: readonly DemoProjectStory[] = [
  {
    slug: 'tidewatch-characters',
    featureBranch: 'feature/new-swim-cycle',
    // The character runtime blends animation layers component-wise and retargets from the root,
    // so sign flips, antipodal pairs, basis turns and mirrors all show on screen.
    ruleOverrides: {
      'hemisphere-jump': 'error',
      'antipodal-keys': 'error',
      'baked-basis': 'error',
      'clip-basis-offset': 'error',
      'mirrored-basis': 'error'
    }
  },
  {
    slug: 'tidewatch-props',
    featureBranch: 'feature/lamp-rework',
    // Prop curves go through a compressor that re-derives arcs, so a near half-turn step may spin backwards.
    ruleOverrides: { 'wide-arc': 'error' }
  },
  {
    slug: 'tidewatch-cinematics',
    featureBranch: 'feature/storm-sequence',
    // A camera that whips or mirrors for one frame ruins a shot.
    ruleOverrides: {
      'spin-spike': 'error',
      'hemisphere-jump': 'error',
      'antipodal-keys': 'error',
      'mirrored-basis': 'error'
    }
  }
];

/**
 * The policy a demo project should run under for the history to read as told: the project's
 * base policy from the demo cast with the story's {@link DemoProjectStory.ruleOverrides} on top.
 * @throws Error when `slug` is not a demo project (a programming error in the demo).
 */
export function getDemoPolicy(slug: DemoProjectSlug): PolicyInput {
  const project = DEMO_PROJECTS.find((candidate) => candidate.slug === slug);
  const story = DEMO_PROJECT_STORIES.find((candidate) => candidate.slug === slug);
  if (!project || !story) throw new Error(`"${slug}" is not a demo project; see demo-accounts.ts.`);
  const base = project.policy as PolicyInput;
  return { ...base, rules: { ...base.rules, ...story.ruleOverrides } };
}

/** A build author: a demo account's name and e-mail. */
export interface DemoAuthor {
  name: string;
  email: string;
}

/** Handles the timeline uses for the demo accounts who push builds. */
export type DemoAuthorHandle = 'tomasz' | 'juno' | 'kaito' | 'priya' | 'lesedi';

/**
 * The demo account behind a handle (its e-mail is `<handle>@lanternfish.example`).
 * @throws Error when the demo cast has no such account (a programming error in the demo).
 */
export function getDemoAuthor(handle: DemoAuthorHandle): DemoAuthor {
  const account = DEMO_ACCOUNTS.find((candidate) => candidate.email.startsWith(`${handle}@`));
  if (!account) throw new Error(`No demo account for build author "${handle}"; see demo-accounts.ts.`);
  return { name: account.name, email: account.email };
}
