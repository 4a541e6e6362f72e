/**
 * The project's base branch: the branch whose builds form the baseline every build is compared
 * with and the default of the trends. It decides what the gate calls "new", so it is edited
 * next to the policy.
 */
import { z } from 'zod';
import { Project } from '../db/models';

/** A git branch name, as CI reports it (git check-ref-format, roughly: no spaces, `..`, `~^:?*[\`). */
export const baseBranchSchema = z.object({
  baseBranch: z
    .string('Enter the branch name.')
    .trim()
    .min(1, 'Enter the branch name, such as main.')
    .max(255, 'Branch names are at most 255 characters.')
    .regex(/^(?!\/|.*\/$|.*\.\.|.*\/\/|.*@\{)[^\s~^:?*[\\]+$/, 'That is not a valid git branch name.')
    .refine(
      (name) => ![...name].some((character) => character.charCodeAt(0) < 0x20 || character.charCodeAt(0) === 0x7f),
      'Branch names have no control characters.'
    )
});

/** Sets the base branch; later builds compare against that branch's latest build. */
export async function setBaseBranch(projectId: number, baseBranch: string): Promise<void> {
  await Project.update({ baseBranch }, { where: { id: projectId } });
}
