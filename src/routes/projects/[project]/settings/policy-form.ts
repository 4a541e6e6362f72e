/**
 * The policy form, generated from the zod policy schema: which fields exist, their kind, limits,
 * choices and defaults all come from `policySchema`, so a field added there shows up here. The
 * same module turns the submitted strings back into a policy and validates it with the schema,
 * in the form action and in the browser for inline messages, keeping what the person typed.
 *
 * Form field names are the fields' dotted paths (`tolerances.unitWarning`, `rules.wide-arc`).
 */
import type { z } from 'zod';
import { policySchema, type Policy } from '$lib/lint/policy';
import type { FieldErrors } from '$lib/components/field-errors';
import { labelFromKey, POLICY_FIELD_TEXT, POLICY_GROUP_TEXT, type PolicyFieldText } from './policy-field-text';

interface FieldBase extends PolicyFieldText {
  path: string;
}

/** A number with the schema's bounds. */
export interface NumberField extends FieldBase {
  kind: 'number';
  defaultValue: number;
  min?: { value: number; isInclusive: boolean };
  max?: { value: number; isInclusive: boolean };
}
/** One of a fixed set of words. */
export interface ChoiceField extends FieldBase {
  kind: 'choice';
  options: string[];
  defaultValue: string;
}
/** A yes/no switch. */
export interface BooleanField extends FieldBase {
  kind: 'boolean';
  defaultValue: boolean;
}
/** A list of globs, one per line. */
export interface GlobListField extends FieldBase {
  kind: 'globs';
  defaultValue: string[];
}
/** Per-rule severity overrides: one choice per rule id, empty meaning the rule's default. */
export interface RuleSeveritiesField extends FieldBase {
  kind: 'rule-severities';
  ruleIds: string[];
  options: string[];
}

export type PolicyField = NumberField | ChoiceField | BooleanField | GlobListField | RuleSeveritiesField;

/** A titled section of the form. */
export interface PolicyFieldGroup {
  id: string;
  title: string;
  description?: string;
  fields: PolicyField[];
}

/** The form's values: every input's text by field name, as typed. */
export type PolicyFormValues = Record<string, string>;

// Only the parts of zod's internal definitions the walk reads.
interface SchemaNode {
  def: {
    type: string;
    innerType?: SchemaNode;
    defaultValue?: unknown;
    shape?: Record<string, SchemaNode>;
    entries?: Record<string, string>;
    keyType?: SchemaNode;
    valueType?: SchemaNode;
    element?: SchemaNode;
    checks?: { _zod: { def: { check: string; value?: number; inclusive?: boolean } } }[];
  };
}

/** The form's sections in schema order; the loose top-level numbers share one section, the globs another. */
export function policyFieldGroups(schema: z.ZodType = policySchema): PolicyFieldGroup[] {
  const root = unwrap(schema as unknown as SchemaNode);
  const groups: PolicyFieldGroup[] = [];
  const groupFor = (id: string) => {
    let group = groups.find((candidate) => candidate.id === id);
    if (!group) {
      group = { id, ...(POLICY_GROUP_TEXT[id] ?? { title: labelFromKey(id) }), fields: [] };
      groups.push(group);
    }
    return group;
  };
  for (const [key, child] of Object.entries(root.def.shape ?? {})) {
    const node = unwrap(child);
    if (node.def.type === 'object') {
      for (const [innerKey, innerChild] of Object.entries(node.def.shape ?? {})) {
        const field = fieldOf(`${key}.${innerKey}`, innerKey, innerChild);
        if (field) groupFor(key).fields.push(field);
      }
      continue;
    }
    const field = fieldOf(key, key, child);
    if (!field) continue;
    const groupId = field.kind === 'globs' ? 'assets' : field.kind === 'rule-severities' ? key : 'thresholds';
    groupFor(groupId).fields.push(field);
  }
  return groups;
}

function fieldOf(path: string, key: string, child: SchemaNode): PolicyField | null {
  const defaultValue = defaultOf(child);
  const node = unwrap(child);
  const text = POLICY_FIELD_TEXT[path] ?? { label: labelFromKey(key) };
  switch (node.def.type) {
    case 'number': {
      const field: NumberField = { kind: 'number', path, ...text, defaultValue: Number(defaultValue) };
      for (const check of node.def.checks ?? []) {
        const { check: name, value, inclusive } = check._zod.def;
        if (value === undefined) continue;
        if (name === 'greater_than') field.min = { value, isInclusive: Boolean(inclusive) };
        if (name === 'less_than') field.max = { value, isInclusive: Boolean(inclusive) };
      }
      return field;
    }
    case 'enum':
      return {
        kind: 'choice',
        path,
        ...text,
        options: Object.values(node.def.entries ?? {}),
        defaultValue: String(defaultValue)
      };
    case 'boolean':
      return { kind: 'boolean', path, ...text, defaultValue: Boolean(defaultValue) };
    case 'array':
      return { kind: 'globs', path, ...text, defaultValue: (defaultValue as string[] | undefined) ?? [] };
    case 'record': {
      const keys = unwrap(node.def.keyType!);
      const values = unwrap(node.def.valueType!);
      return {
        kind: 'rule-severities',
        path,
        ...text,
        ruleIds: Object.values(keys.def.entries ?? {}),
        options: Object.values(values.def.entries ?? {})
      };
    }
    default:
      // The policy's own `version` literal and anything the form cannot edit keep their defaults.
      return null;
  }
}

function unwrap(node: SchemaNode): SchemaNode {
  let current = node;
  while (current.def.innerType && ['default', 'optional', 'prefault', 'nullable'].includes(current.def.type)) {
    current = current.def.innerType;
  }
  return current;
}

function defaultOf(node: SchemaNode): unknown {
  let current: SchemaNode | undefined = node;
  while (current) {
    if (current.def.type === 'default') {
      const value = current.def.defaultValue;
      return typeof value === 'function' ? (value as () => unknown)() : value;
    }
    current = current.def.innerType;
  }
  return undefined;
}

/** Every field name of the form (rule severities expand to one per rule). */
export function fieldNames(groups: readonly PolicyFieldGroup[]): string[] {
  return groups.flatMap((group) =>
    group.fields.flatMap((field) =>
      field.kind === 'rule-severities' ? field.ruleIds.map((id) => `${field.path}.${id}`) : [field.path]
    )
  );
}

/** The form's values for a policy (what the inputs show). */
export function valuesOfPolicy(policy: Policy, groups: readonly PolicyFieldGroup[]): PolicyFormValues {
  const values: PolicyFormValues = {};
  for (const field of groups.flatMap((group) => group.fields)) {
    const value = readPath(policy, field.path);
    if (field.kind === 'rule-severities') {
      const overrides = (value ?? {}) as Record<string, string>;
      for (const id of field.ruleIds) values[`${field.path}.${id}`] = overrides[id] ?? '';
    } else if (field.kind === 'globs') values[field.path] = ((value as string[] | undefined) ?? []).join('\n');
    else if (field.kind === 'boolean') values[field.path] = value ? 'true' : '';
    else values[field.path] = value === undefined ? '' : String(value);
  }
  return values;
}

/** The form's values from a submitted form: checkboxes count as `true` when present. */
export function valuesOfForm(form: FormData, groups: readonly PolicyFieldGroup[]): PolicyFormValues {
  const booleans = new Set(
    groups.flatMap((group) => group.fields.filter((field) => field.kind === 'boolean').map((field) => field.path))
  );
  const values: PolicyFormValues = {};
  for (const name of fieldNames(groups)) {
    const value = form.get(name);
    values[name] = booleans.has(name) ? (value === null ? '' : 'true') : typeof value === 'string' ? value : '';
  }
  return values;
}

/**
 * Turns the form's values into a policy and validates it with the schema.
 * Returns the policy, or the first message per field (numbers that are not numbers are caught
 * before the schema, so their message can say so plainly).
 */
export function parsePolicyForm(
  values: PolicyFormValues,
  groups: readonly PolicyFieldGroup[]
): { policy: Policy; fieldErrors: null } | { policy: null; fieldErrors: FieldErrors } {
  const candidate: Record<string, unknown> = {};
  const fieldErrors: FieldErrors = {};
  for (const field of groups.flatMap((group) => group.fields)) {
    if (field.kind === 'rule-severities') {
      const overrides: Record<string, string> = {};
      for (const id of field.ruleIds) {
        const value = values[`${field.path}.${id}`] ?? '';
        if (value !== '') overrides[id] = value;
      }
      writePath(candidate, field.path, overrides);
      continue;
    }
    const raw = values[field.path] ?? '';
    if (field.kind === 'boolean') writePath(candidate, field.path, raw === 'true');
    else if (field.kind === 'globs') {
      const globs = raw
        .split('\n')
        .map((line) => line.trim())
        .filter((line) => line !== '');
      writePath(candidate, field.path, globs);
    } else if (field.kind === 'choice') writePath(candidate, field.path, raw);
    else if (raw.trim() === '') fieldErrors[field.path] = `Enter a number (default ${field.defaultValue}).`;
    else if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(raw.trim())) {
      fieldErrors[field.path] = `“${raw.trim()}” is not a number; write it like 0.001 or 1e-3.`;
    } else writePath(candidate, field.path, Number(raw.trim()));
  }
  const result = policySchema.safeParse(candidate, { error: messageOf });
  if (result.success && Object.keys(fieldErrors).length === 0) return { policy: result.data, fieldErrors: null };
  const fields = groups.flatMap((group) => group.fields);
  for (const issue of result.error?.issues ?? []) {
    const path = issue.path.map(String);
    // Errors inside a glob list belong to the list's field; a rule's to its own select.
    const name =
      fields.find((field) => field.kind === 'globs' && field.path === path[0])?.path ?? path.join('.') ?? 'form';
    fieldErrors[name] ??= capitalise(withLabels(issue.message, fields));
  }
  return { policy: null, fieldErrors };
}

/** Messages in the form's own words for the schema's number limits and choices. */
function messageOf(issue: z.core.$ZodRawIssue): string | undefined {
  if (issue.code === 'too_small' && issue.origin === 'number') {
    return `Must be ${issue.inclusive ? 'at least' : 'more than'} ${String(issue.minimum)}.`;
  }
  if (issue.code === 'too_big' && issue.origin === 'number') {
    return `Must be ${issue.inclusive ? 'at most' : 'less than'} ${String(issue.maximum)}.`;
  }
  if (issue.code === 'invalid_value') return `Choose one of ${issue.values.map(String).join(', ')}.`;
  if (issue.code === 'too_small' && issue.origin === 'string') return 'Remove the empty line.';
  return undefined;
}

/** Field paths in a schema message (`must be at least tolerances.unitWarning`) read as their labels. */
function withLabels(message: string, fields: readonly PolicyField[]): string {
  return message.replace(/\b[a-zA-Z]+(\.[a-zA-Z]+)+\b/g, (path) => {
    const field = fields.find((candidate) => candidate.path === path);
    return field ? `“${field.label}”` : path;
  });
}

function capitalise(message: string): string {
  return message.charAt(0).toUpperCase() + message.slice(1);
}

function readPath(value: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((node, key) => (node as Record<string, unknown> | undefined)?.[key], value);
}

function writePath(target: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.');
  let node = target;
  for (const key of keys.slice(0, -1)) node = (node[key] ??= {}) as Record<string, unknown>;
  node[keys[keys.length - 1]] = value;
}
