/**
 * The escaped SQL of a finding's own columns (FINDING_COLUMN_NAMES, in that order), made once
 * per finding: ingestion prepares them as each asset's lint arrives, while the upload still
 * streams in, so the write transaction at the end only joins strings (see insert-rows.ts).
 */
import type { Sequelize } from 'sequelize';
import type { Finding } from '../../lint/finding';
import { findingValuesOf } from '../builds/finding-columns';
import { escapeValues, type EscapedValues } from '../db/insert-rows';

/** Per finding object: the literals and the database they were escaped for. */
const prepared = new WeakMap<Finding, { sequelize: Sequelize; values: EscapedValues }>();

/** Escapes the columns of `findings` now, for a later {@link findingRowValues}. */
export function prepareFindingRowValues(sequelize: Sequelize, findings: readonly Finding[]): void {
  for (const finding of findings) findingRowValues(sequelize, finding);
}

/** The escaped columns of `finding`, prepared earlier or made now. */
export function findingRowValues(sequelize: Sequelize, finding: Finding): EscapedValues {
  const known = prepared.get(finding);
  if (known?.sequelize === sequelize) return known.values;
  const values = escapeValues(sequelize, findingValuesOf(finding));
  prepared.set(finding, { sequelize, values });
  return values;
}
