/**
 * The invented cast of the demo: Lanternfish Interactive, a fictional studio making the game
 * "Tidewatch". Plain data with no imports, so the seed, the demo script and browser tests share it.
 * The passwords are public on purpose; never reuse them outside a demo.
 */

export interface DemoAccount {
  email: string;
  name: string;
  role: 'admin' | 'lead' | 'artist' | 'viewer';
  password: string;
  /** What they do at the studio, for the printed list. */
  title: string;
}

export interface DemoProject {
  slug: string;
  name: string;
  baseBranch: string;
  /** What the project holds, for the printed list. */
  summary: string;
  /** Members by e-mail with their project role; the admin sees every project anyway. */
  members: Record<string, 'lead' | 'artist' | 'viewer'>;
  /** Policy overrides on top of the defaults. */
  policy: Record<string, unknown>;
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  {
    email: 'wren@lanternfish.example',
    name: 'Wren Halloway',
    role: 'admin',
    password: 'tidewatch-admin',
    title: 'Technical director'
  },
  {
    email: 'tomasz@lanternfish.example',
    name: 'Tomasz Erikssen',
    role: 'lead',
    password: 'tidewatch-lead',
    title: 'Animation lead, characters'
  },
  {
    email: 'priya@lanternfish.example',
    name: 'Priya Castellane',
    role: 'lead',
    password: 'tidewatch-lead',
    title: 'Lead artist, props and cinematics'
  },
  {
    email: 'juno@lanternfish.example',
    name: 'Juno Abara',
    role: 'artist',
    password: 'tidewatch-artist',
    title: 'Character animator'
  },
  {
    email: 'kaito@lanternfish.example',
    name: 'Kaito Brennan',
    role: 'artist',
    password: 'tidewatch-artist',
    title: 'Rigger'
  },
  {
    email: 'lesedi@lanternfish.example',
    name: 'Lesedi Morrow',
    role: 'artist',
    password: 'tidewatch-artist',
    title: 'Layout and camera artist'
  },
  {
    email: 'odile@lanternfish.example',
    name: 'Odile Fairweather',
    role: 'viewer',
    password: 'tidewatch-viewer',
    title: 'Producer'
  }
];

export const DEMO_PROJECTS: readonly DemoProject[] = [
  {
    slug: 'tidewatch-characters',
    name: 'Tidewatch Characters',
    baseBranch: 'main',
    summary: 'heroes and crew with skeletons: walk, climb and idle clips',
    members: {
      'tomasz@lanternfish.example': 'lead',
      'juno@lanternfish.example': 'artist',
      'kaito@lanternfish.example': 'artist',
      'odile@lanternfish.example': 'viewer'
    },
    policy: {}
  },
  {
    slug: 'tidewatch-props',
    name: 'Tidewatch Props',
    baseBranch: 'main',
    summary: 'harbour props with spinning parts: lighthouse lamp, windlass, buoys',
    members: {
      'priya@lanternfish.example': 'lead',
      'kaito@lanternfish.example': 'artist',
      'lesedi@lanternfish.example': 'artist',
      'odile@lanternfish.example': 'viewer'
    },
    // A lamp turns fast on purpose: allow 6 turns per second before spin-spike speaks.
    policy: { maxSpeedDegreesPerSecond: 2160 }
  },
  {
    slug: 'tidewatch-cinematics',
    name: 'Tidewatch Cinematics',
    baseBranch: 'main',
    summary: 'camera rigs for the cut-scenes, imported into an engine that stores Euler angles',
    members: {
      'priya@lanternfish.example': 'lead',
      'tomasz@lanternfish.example': 'artist',
      'lesedi@lanternfish.example': 'artist',
      'odile@lanternfish.example': 'viewer'
    },
    policy: { engine: { rotationStorage: 'euler', eulerOrder: 'YXZ', gimbalMarginDegrees: 5 } }
  }
];
