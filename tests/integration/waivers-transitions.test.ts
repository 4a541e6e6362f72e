/**
 * A waiver's life against a real (temporary) database: who may propose, approve, reject and
 * revoke, which changes each state allows, the history each change writes, and how expiry shows.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Project, User, Waiver, WaiverEvent } from '$lib/server/db/models';
import { ForbiddenError } from '$lib/server/errors';
import { listWaiverEvents } from '$lib/server/waivers/list-waiver-events';
import { findWaiver, listWaivers } from '$lib/server/waivers/list-waivers';
import { WaiverNotFoundError, WaiverStateError } from '$lib/server/waivers/waiver-errors';
import { proposeWaiverSchema, type ProposeWaiverInput } from '$lib/server/waivers/waiver-input';
import * as waivers from '$lib/server/waivers/waivers';
import type { WaiverActor } from '$lib/server/waivers/waivers';
import type { ProjectRole } from '$lib/types/roles';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let project: Project;
let otherProject: Project;
const actors = {} as Record<ProjectRole, WaiverActor>;

beforeAll(async () => {
  temp = await openTempDatabase();
  project = await Project.create({ slug: 'tidewatch-props', name: 'Tidewatch Props' });
  otherProject = await Project.create({ slug: 'tidewatch-cinematics', name: 'Tidewatch Cinematics' });
  for (const role of ['lead', 'artist', 'viewer'] as const) {
    const user = await User.create({
      email: `${role}@lanternfish.example`,
      name: `The ${role}`,
      passwordHash: 'not-a-real-hash',
      role
    });
    actors[role] = { user: { id: user.id, email: user.email, name: user.name, role: user.role }, role };
  }
});
afterAll(async () => temp?.remove());

function input(overrides: Partial<Record<string, string>> = {}): ProposeWaiverInput {
  return proposeWaiverSchema.parse({
    scope: 'fingerprint',
    fingerprint: '0123456789abcdef',
    reason: 'The lamp snaps on purpose at the top of each turn.',
    ...overrides
  });
}

async function proposed(): Promise<Waiver> {
  return waivers.propose(project, actors.artist, input());
}

describe('proposing', () => {
  it('lets an artist propose, writing a "proposed" history line', async () => {
    const waiver = await proposed();
    expect(waiver.status).toBe('proposed');
    expect(waiver.proposedById).toBe(actors.artist.user.id);
    const events = await WaiverEvent.findAll({ where: { waiverId: waiver.id } });
    expect(events.map((event) => [event.action, event.userId])).toEqual([['proposed', actors.artist.user.id]]);
  });

  it('refuses a viewer with a ForbiddenError and writes nothing', async () => {
    const before = await Waiver.count();
    await expect(waivers.propose(project, actors.viewer, input())).rejects.toBeInstanceOf(ForbiddenError);
    expect(await Waiver.count()).toBe(before);
  });

  it('stores a rule-and-asset waiver with the path as builds store it, and no fingerprint', async () => {
    const waiver = await waivers.propose(
      project,
      actors.lead,
      input({
        scope: 'rule-asset',
        fingerprint: 'ffffffffffffffff',
        rule: 'spin-spike',
        assetPath: '.\\props\\lamp.glb'
      })
    );
    expect([waiver.scope, waiver.rule, waiver.assetPath, waiver.fingerprint]).toEqual([
      'rule-asset',
      'spin-spike',
      'props/lamp.glb',
      null
    ]);
  });

  it('holds an expiry day until the end of that day in UTC and refuses a day already past', async () => {
    const now = new Date('2031-05-10T12:00:00Z');
    const waiver = await waivers.propose(project, actors.artist, input({ expiresOn: '2031-05-10' }), now);
    expect(waiver.expiresAt?.toISOString()).toBe('2031-05-10T23:59:59.999Z');
    await expect(
      waivers.propose(project, actors.artist, input({ expiresOn: '2031-05-09' }), now)
    ).rejects.toMatchObject({ code: 'waiver.expiry-past', status: 409 });
  });
});

describe('deciding', () => {
  it('lets a lead approve a proposal, recording who and when, with the note in the history', async () => {
    const waiver = await proposed();
    const approved = await waivers.decide(project, actors.lead, waiver.id, {
      action: 'approve',
      note: 'Checked in engine.'
    });
    expect([approved.status, approved.decidedById]).toEqual(['approved', actors.lead.user.id]);
    expect(approved.decidedAt).toBeInstanceOf(Date);
    const history = await listWaiverEvents(project.id);
    expect(history.find((event) => event.waiverId === waiver.id && event.action === 'approved')).toMatchObject({
      note: 'Checked in engine.',
      user: { id: actors.lead.user.id }
    });
  });

  it.each(['artist', 'viewer'] as const)('refuses approval by an %s', async (role) => {
    const waiver = await proposed();
    await expect(waivers.decide(project, actors[role], waiver.id, { action: 'approve' })).rejects.toBeInstanceOf(
      ForbiddenError
    );
    expect((await Waiver.findByPk(waiver.id))?.status).toBe('proposed');
  });

  it('lets a lead reject a proposal, after which it can be neither approved nor revoked', async () => {
    const waiver = await proposed();
    await waivers.decide(project, actors.lead, waiver.id, { action: 'reject', note: 'Fix the export instead.' });
    for (const action of ['approve', 'reject', 'revoke'] as const) {
      await expect(waivers.decide(project, actors.lead, waiver.id, { action })).rejects.toBeInstanceOf(
        WaiverStateError
      );
    }
  });

  it('lets a lead revoke an approved waiver, and only an approved one', async () => {
    const waiver = await proposed();
    await expect(waivers.decide(project, actors.lead, waiver.id, { action: 'revoke' })).rejects.toMatchObject({
      code: 'waiver.state'
    });
    await waivers.decide(project, actors.lead, waiver.id, { action: 'approve' });
    const revoked = await waivers.decide(project, actors.lead, waiver.id, { action: 'revoke', note: 'Snap removed.' });
    expect(revoked.status).toBe('revoked');
    // Revoking keeps the approval's author: the history says who revoked.
    expect(revoked.decidedById).toBe(actors.lead.user.id);
    const actions = (await WaiverEvent.findAll({ where: { waiverId: waiver.id }, order: [['id', 'ASC']] })).map(
      (event) => event.action
    );
    expect(actions).toEqual(['proposed', 'approved', 'revoked']);
  });

  it('refuses a second approval of the same proposal (two leads deciding at once)', async () => {
    const waiver = await proposed();
    const results = await Promise.allSettled([
      waivers.decide(project, actors.lead, waiver.id, { action: 'approve' }),
      waivers.decide(project, actors.lead, waiver.id, { action: 'reject' })
    ]);
    expect(results.filter((result) => result.status === 'fulfilled')).toHaveLength(1);
    expect(results.find((result) => result.status === 'rejected')).toMatchObject({
      reason: expect.any(WaiverStateError)
    });
    expect(await WaiverEvent.count({ where: { waiverId: waiver.id } })).toBe(2);
  });

  it('answers not found for a waiver of another project', async () => {
    const foreign = await waivers.propose(otherProject, actors.lead, input());
    await expect(waivers.decide(project, actors.lead, foreign.id, { action: 'approve' })).rejects.toBeInstanceOf(
      WaiverNotFoundError
    );
  });

  it('refuses to approve a proposal whose expiry has passed', async () => {
    const waiver = await waivers.propose(
      project,
      actors.artist,
      input({ expiresOn: '2031-01-01' }),
      new Date('2030-12-31')
    );
    await expect(
      waivers.decide(project, actors.lead, waiver.id, { action: 'approve' }, new Date('2031-01-02T00:00:00Z'))
    ).rejects.toMatchObject({ code: 'waiver.expired' });
  });
});

describe('listing', () => {
  it('shows an approved waiver past its expiry as expired, and one before it as approved', async () => {
    const waiver = await waivers.propose(
      project,
      actors.artist,
      input({ expiresOn: '2032-03-01' }),
      new Date('2032-02-01')
    );
    await waivers.decide(project, actors.lead, waiver.id, { action: 'approve' }, new Date('2032-02-02'));
    expect((await findWaiver(project.id, waiver.id, new Date('2032-03-01T12:00:00Z')))?.state).toBe('approved');
    expect((await findWaiver(project.id, waiver.id, new Date('2032-03-02T00:00:00Z')))?.state).toBe('expired');
  });

  it('names who revoked a revoked waiver, from its history', async () => {
    const waiver = await proposed();
    await waivers.decide(project, actors.lead, waiver.id, { action: 'approve' });
    await waivers.decide(project, actors.lead, waiver.id, { action: 'revoke' });
    const view = await findWaiver(project.id, waiver.id);
    expect(view).toMatchObject({ state: 'revoked', revokedBy: { id: actors.lead.user.id, name: 'The lead' } });
    expect(view?.revokedAt).toEqual(expect.any(String));
  });

  it('lists only the project’s own waivers, newest first, with who proposed them', async () => {
    const list = await listWaivers(project.id);
    expect(list.length).toBeGreaterThan(0);
    expect(list.map((waiver) => waiver.id)).toEqual([...list.map((waiver) => waiver.id)].sort((a, b) => b - a));
    expect(list.every((waiver) => waiver.proposedBy !== null)).toBe(true);
    const foreignIds = (await Waiver.findAll({ where: { projectId: otherProject.id } })).map((waiver) => waiver.id);
    expect(list.some((waiver) => foreignIds.includes(waiver.id))).toBe(false);
  });
});
