/**
 * What a build's findings can be filtered by: the rules and assets that have findings in it,
 * with their counts, so the build report's filters only offer choices that match something.
 */
import { col, fn } from 'sequelize';
import { RULES } from '../../lint/rules/index';
import { FindingRecord } from '../db/models';

/** A rule present in the build's findings. */
export interface RuleFacet {
  rule: string;
  /** The rule's one-line title; the id itself for a rule this engine no longer knows. */
  title: string;
  count: number;
}

/** An asset path present in the build's findings. */
export interface AssetFacet {
  path: string;
  count: number;
}

/** The filter choices of a build's findings. */
export interface FindingFacets {
  rules: RuleFacet[];
  assets: AssetFacet[];
}

/** Rules (by id) and assets (by path) with at least one finding of any standing in the build. */
export async function listFindingFacets(buildId: number): Promise<FindingFacets> {
  const [ruleRows, assetRows] = (await Promise.all([
    FindingRecord.findAll({
      attributes: ['rule', [fn('COUNT', col('id')), 'count']],
      where: { buildId },
      group: ['rule'],
      raw: true
    }),
    FindingRecord.findAll({
      attributes: ['assetPath', [fn('COUNT', col('id')), 'count']],
      where: { buildId },
      group: ['assetPath'],
      raw: true
    })
  ])) as unknown as [{ rule: string; count: number }[], { assetPath: string; count: number }[]];
  const titles = new Map<string, string>(RULES.map((rule) => [rule.id, rule.title]));
  return {
    rules: ruleRows
      .map((row) => ({ rule: row.rule, title: titles.get(row.rule) ?? row.rule, count: Number(row.count) }))
      .sort((a, b) => a.rule.localeCompare(b.rule)),
    assets: assetRows
      .map((row) => ({ path: row.assetPath, count: Number(row.count) }))
      .sort((a, b) => a.path.localeCompare(b.path))
  };
}
