import type { PolicyInput } from '$lib/lint/policy';

/**
 * The fictional studio behind the demo and its three projects. Everything here is invented:
 * Lanternfish Interactive, its game Tidewatch, its people and its CI host (`.example` domains
 * never resolve).
 */

/** The studio and game the demo data belongs to. */
export const DEMO_STUDIO = {
  name: 'Lanternfish Interactive',
  game: 'Tidewatch',
  ciHost: 'https://ci.lanternfish.example',
  emailDomain: 'lanternfish.example'
} as const;

/** Slugs of the demo projects. */
export type DemoProjectSlug = 'tidewatch-characters' | 'tidewatch-props' | 'tidewatch-cinematics';

/** A demo project: what it holds and the feature branch its story runs on besides `main`. */
export interface DemoProject {
  slug: DemoProjectSlug;
  name: string;
  description: string;
  defaultBranch: 'main';
  featureBranch: string;
  /**
   * The lint policy the project runs under in the demo. Each team raises to `error` the rules its
   * runtime cannot tolerate, so the default gate (fail on errors) stops exactly those builds.
   */
  policy: PolicyInput;
}

/** The three projects, in the order the demo lists them. */
export const DEMO_PROJECTS: readonly DemoProject[] = [
  {
    slug: 'tidewatch-characters',
    name: 'Tidewatch Characters',
    description: 'Skinned characters of the harbor town: Kelp Diver, Harbor Warden, Lamp Keeper and Net Mender.',
    defaultBranch: 'main',
    featureBranch: 'feature/new-swim-cycle',
    // The character runtime blends animation layers component-wise and retargets from the root,
    // so sign flips, antipodal pairs, basis turns and mirrors all show on screen.
    policy: {
      rules: {
        'hemisphere-jump': 'error',
        'antipodal-keys': 'error',
        'baked-basis': 'error',
        'clip-basis-offset': 'error',
        'mirrored-basis': 'error'
      }
    }
  },
  {
    slug: 'tidewatch-props',
    name: 'Tidewatch Props',
    description: 'Props with moving parts: the lighthouse lamp, the dock windlass and the tide buoy.',
    defaultBranch: 'main',
    featureBranch: 'feature/lamp-rework',
    // Prop curves go through a compressor that re-derives arcs, so a near half-turn step may spin backwards.
    policy: { rules: { 'wide-arc': 'error' } }
  },
  {
    slug: 'tidewatch-cinematics',
    name: 'Tidewatch Cinematics',
    description: 'Camera rigs for the harbor intro and the storm sequence.',
    defaultBranch: 'main',
    featureBranch: 'feature/storm-sequence',
    // A camera that whips or mirrors for one frame ruins a shot; everything else stays a warning.
    policy: {
      rules: { 'spin-spike': 'error', 'hemisphere-jump': 'error', 'antipodal-keys': 'error', 'mirrored-basis': 'error' }
    }
  }
];

/** A person of the fictional studio who pushes builds. */
export interface DemoAuthor {
  name: string;
  email: string;
  role: string;
}

const author = (name: string, role: string): DemoAuthor => ({
  name,
  role,
  email: `${name.toLowerCase().replace(/ /g, '.')}@${DEMO_STUDIO.emailDomain}`
});

/** The studio's people, by the handle the timeline uses. */
export const DEMO_AUTHORS = {
  ines: author('Ines Saltmarsh', 'Animation lead'),
  tobin: author('Tobin Reedwater', 'Character animator'),
  priya: author('Priya Lanthorn', 'Technical artist'),
  oskar: author('Oskar Brinefield', 'Props artist'),
  della: author('Della Quayside', 'Cinematics lead'),
  wen: author('Wen Tidemoor', 'Layout artist')
} as const satisfies Record<string, DemoAuthor>;

/** Handles of {@link DEMO_AUTHORS}. */
export type DemoAuthorHandle = keyof typeof DEMO_AUTHORS;
