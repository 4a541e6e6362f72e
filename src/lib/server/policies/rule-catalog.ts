/**
 * Every rule id with its one-line title and default severity, for pickers and the policy form:
 * pages get plain data and do not bundle the rules themselves.
 */
import type { Severity } from '../../lint/finding';
import { RULE_IDS, type RuleId } from '../../lint/rule-ids';
import { RULES } from '../../lint/rules/index';

/** One rule as forms list it. */
export interface RuleCatalogEntry {
  id: RuleId;
  title: string;
  defaultSeverity: Severity;
}

/** The reader, not a rule, raises `asset-unreadable`; it has no entry in RULES. */
const READER_RULE: Omit<RuleCatalogEntry, 'id'> = {
  title: 'The file could not be read as glTF 2.0',
  defaultSeverity: 'error'
};

/** The rules in report order (the order of RULE_IDS). */
export function listRuleCatalog(): RuleCatalogEntry[] {
  return RULE_IDS.map((id) => {
    const rule = RULES.find((candidate) => candidate.id === id);
    if (rule) return { id, title: rule.title, defaultSeverity: rule.defaultSeverity };
    return { id, ...READER_RULE, title: id === 'asset-unreadable' ? READER_RULE.title : id };
  });
}
