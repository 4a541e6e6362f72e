/**
 * The waivers of the demo story, made the way people make them: an artist proposes through the
 * waivers module, a lead approves or rejects. The demo calls this halfway through the build
 * history, so the later builds show findings as waived and the waivers page has a history.
 */
import { toSessionUser } from '../auth/session-user';
import { Project, ProjectMembership, User } from '../db/models';
import * as waivers from '../waivers/waivers';
import type { ProposeWaiverInput } from '../waivers/waiver-input';

interface DemoWaiver {
  project: string;
  proposedBy: string;
  decidedBy: string | null;
  decision: 'approve' | 'reject' | null;
  note: string | null;
  input: ProposeWaiverInput;
}

const DEMO_WAIVERS: readonly DemoWaiver[] = [
  {
    project: 'tidewatch-characters',
    proposedBy: 'juno@lanternfish.example',
    decidedBy: 'tomasz@lanternfish.example',
    decision: 'approve',
    note: 'Fine until the retarget pass; revisit then.',
    input: {
      scope: 'rule-asset',
      rule: 'redundant-keys',
      assetPath: 'chars/harbor-warden.gltf',
      reason:
        'The held keys on the wave are the retarget anchors from the mocap session; the engine strips them on import.'
    }
  },
  {
    project: 'tidewatch-characters',
    proposedBy: 'kaito@lanternfish.example',
    decidedBy: null,
    decision: null,
    note: null,
    input: {
      scope: 'rule-asset',
      rule: 'unit-drift',
      assetPath: 'chars/lamp-keeper.glb',
      reason: 'The idle head drift is an exporter rounding issue; the rig update in two weeks re-exports it.'
    }
  },
  {
    project: 'tidewatch-props',
    proposedBy: 'lesedi@lanternfish.example',
    decidedBy: 'priya@lanternfish.example',
    decision: 'approve',
    note: null,
    input: {
      scope: 'rule-asset',
      rule: 'redundant-keys',
      assetPath: 'props/tide-buoy.gltf',
      reason: 'The clapper rests between strikes on purpose; the extra keys keep the strike timing readable for sound.'
    }
  },
  {
    project: 'tidewatch-props',
    proposedBy: 'kaito@lanternfish.example',
    decidedBy: 'priya@lanternfish.example',
    decision: 'reject',
    note: 'The prop compressor re-derives arcs: a half-turn step can spin backwards in game. Add keys instead.',
    input: {
      scope: 'rule-asset',
      rule: 'wide-arc',
      assetPath: 'props/lighthouse-lamp.glb',
      reason: 'The rotor only needs four keys per turn.'
    }
  }
];

/** Proposes and decides the demo's waivers; returns how many were made. */
export async function seedDemoWaivers(): Promise<number> {
  for (const demo of DEMO_WAIVERS) {
    const project = await Project.findOne({ where: { slug: demo.project } });
    if (!project) throw new Error(`The demo waivers name ${demo.project}, which the seed did not make.`);
    const waiver = await waivers.propose(project, await actorOf(project.id, demo.proposedBy), demo.input);
    if (demo.decision && demo.decidedBy) {
      await waivers.decide(project, await actorOf(project.id, demo.decidedBy), waiver.id, {
        action: demo.decision,
        note: demo.note ?? undefined
      });
    }
  }
  return DEMO_WAIVERS.length;
}

async function actorOf(projectId: number, email: string): Promise<waivers.WaiverActor> {
  const user = await User.findOne({ where: { email } });
  const membership = user && (await ProjectMembership.findOne({ where: { projectId, userId: user.id } }));
  if (!user || !membership)
    throw new Error(`The demo waivers name ${email}, who is not a member of project ${projectId}.`);
  return { user: toSessionUser(user), role: membership.role };
}
