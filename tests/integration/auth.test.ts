import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isHttpError } from '@sveltejs/kit';
import { verifyCredentials } from '$lib/server/auth/credentials';
import { hashPassword } from '$lib/server/auth/password';
import { getProjectAccess, listVisibleProjects } from '$lib/server/auth/project-access';
import { requireProjectRole } from '$lib/server/auth/require-project-role';
import { requireUser } from '$lib/server/auth/require-user';
import { findSessionUser, toSessionUser } from '$lib/server/auth/session-user';
import { Project, ProjectMembership, User } from '$lib/server/db/models';
import { ForbiddenError, NotFoundError } from '$lib/server/errors';
import type { SessionUser } from '$lib/types/session-user';
import { openTempDatabase, type TempDatabase } from './temp-database';

let temp: TempDatabase;
let admin: SessionUser;
let lead: SessionUser;
let viewer: SessionUser;
let outsider: SessionUser;

beforeAll(async () => {
  temp = await openTempDatabase();
  const passwordHash = await hashPassword('correct horse');
  const make = async (email: string, role: User['role']) =>
    toSessionUser(await User.create({ email, name: email.split('@')[0], role, passwordHash }));
  admin = await make('admin@lanternfish.example', 'admin');
  lead = await make('lead@lanternfish.example', 'lead');
  viewer = await make('viewer@lanternfish.example', 'viewer');
  outsider = await make('outsider@lanternfish.example', 'artist');
  await User.create({
    email: 'gone@lanternfish.example',
    name: 'Gone',
    role: 'artist',
    passwordHash,
    disabledAt: new Date()
  });
  const props = await Project.create({ slug: 'harbour-props', name: 'Harbour Props' });
  const crew = await Project.create({ slug: 'harbour-crew', name: 'Harbour Crew' });
  await ProjectMembership.bulkCreate([
    { projectId: props.id, userId: lead.id, role: 'lead' },
    { projectId: props.id, userId: viewer.id, role: 'viewer' },
    { projectId: crew.id, userId: lead.id, role: 'artist' }
  ]);
});
afterAll(async () => {
  await temp.remove();
});

describe('checking credentials', () => {
  it('accepts the right password, whatever the e-mail case', async () => {
    expect(await verifyCredentials('Lead@Lanternfish.Example', 'correct horse')).toEqual(lead);
  });

  it('refuses a wrong password, an unknown address and a disabled account alike', async () => {
    expect(await verifyCredentials('lead@lanternfish.example', 'wrong horse')).toBeNull();
    expect(await verifyCredentials('nobody@lanternfish.example', 'correct horse')).toBeNull();
    expect(await verifyCredentials('gone@lanternfish.example', 'correct horse')).toBeNull();
  });

  it('drops the session of a disabled or deleted account on the next request', async () => {
    expect(await findSessionUser(viewer.id)).toEqual(viewer);
    const gone = await User.findOne({ where: { email: 'gone@lanternfish.example' } });
    expect(await findSessionUser(gone!.id)).toBeNull();
    expect(await findSessionUser(999_999)).toBeNull();
  });
});

describe('project access', () => {
  it('lets an admin into every project as a lead', async () => {
    const access = await getProjectAccess(admin, 'harbour-crew', 'lead');
    expect(access).toMatchObject({ role: 'lead', isAdmin: true });
    expect((await listVisibleProjects(admin)).map((p) => p.slug)).toEqual(['harbour-crew', 'harbour-props']);
  });

  it('gives members their own role', async () => {
    expect((await getProjectAccess(lead, 'harbour-props', 'lead')).role).toBe('lead');
    expect((await getProjectAccess(lead, 'harbour-crew', 'viewer')).role).toBe('artist');
    expect((await getProjectAccess(viewer, 'harbour-props')).role).toBe('viewer');
  });

  it('hides a project from non-members exactly like an unknown slug', async () => {
    const hidden = await getProjectAccess(outsider, 'harbour-props').catch((error: unknown) => error);
    const unknown = await getProjectAccess(outsider, 'no-such-project').catch((error: unknown) => error);
    expect(hidden).toBeInstanceOf(NotFoundError);
    expect(unknown).toBeInstanceOf(NotFoundError);
    expect((hidden as NotFoundError).code).toBe('project.not-found');
    expect((hidden as Error).message.replace('harbour-props', 'X')).toBe(
      (unknown as Error).message.replace('no-such-project', 'X')
    );
    expect(await listVisibleProjects(outsider)).toEqual([]);
  });

  it('refuses a member below the needed role with a message naming both roles', async () => {
    const error = await getProjectAccess(viewer, 'harbour-props', 'artist').catch((caught: unknown) => caught);
    expect(error).toBeInstanceOf(ForbiddenError);
    expect((error as Error).message).toBe(
      'This needs the artist role in Harbour Props; you are a viewer. Ask a project lead.'
    );
  });

  it('lists only the projects a member belongs to', async () => {
    expect((await listVisibleProjects(viewer)).map((p) => p.slug)).toEqual(['harbour-props']);
    expect((await listVisibleProjects(lead)).map((p) => p.slug)).toEqual(['harbour-crew', 'harbour-props']);
  });
});

describe('route guards', () => {
  async function statusOf(promise: Promise<unknown>): Promise<number | undefined> {
    const error = await promise.then(
      () => undefined,
      (caught: unknown) => caught
    );
    return isHttpError(error) ? error.status : undefined;
  }

  it('answer 404 to non-members, 403 to members below the role, and the access to everyone else', async () => {
    expect(await statusOf(requireProjectRole({ user: outsider }, 'harbour-props'))).toBe(404);
    expect(await statusOf(requireProjectRole({ user: viewer }, 'harbour-props', 'lead'))).toBe(403);
    expect((await requireProjectRole({ user: lead }, 'harbour-props', 'lead')).project.slug).toBe('harbour-props');
  });

  it('answer 401 when nobody is signed in', async () => {
    expect(() => requireUser({ user: null })).toThrow();
    expect(await statusOf(requireProjectRole({ user: null }, 'harbour-props'))).toBe(401);
  });
});
