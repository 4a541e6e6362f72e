import { describe, expect, it } from 'vitest';
import { RULE_IDS } from '../rule-ids';
import { toJunitXml } from './junit-xml';
import { makeAsset, makeFinding, makeReport, sampleReport } from './sample-report.fixture';

/**
 * A deliberately small XML 1.0 reader for these tests: it rejects anything not well-formed
 * (XML 1.0 §2.1: one root, properly nested and closed elements; §2.4: no raw `<` or `&` in
 * character data and no `]]>`; §3.1: quoted, unique attributes; §4.1: only the five predefined
 * entities and numeric references) and returns the element tree with references decoded, so
 * tests can compare values with the strings that went in. No DTDs, CDATA or comments: the
 * writer never emits them, so meeting one is an error too.
 */
interface XmlElement {
  name: string;
  attributes: Record<string, string>;
  children: XmlElement[];
  text: string;
}

const NAME = /^[A-Za-z_][\w.-]*/;
const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

function decodeReferences(raw: string, where: string): string {
  return raw.replace(/&([^;]*);?/g, (match, body: string) => {
    if (!match.endsWith(';')) throw new Error(`bare & in ${where}`);
    if (body in ENTITIES) return ENTITIES[body];
    const numeric = /^#(?:x([0-9a-fA-F]+)|([0-9]+))$/.exec(body);
    if (!numeric) throw new Error(`unknown reference &${body}; in ${where}`);
    return String.fromCodePoint(numeric[1] ? parseInt(numeric[1], 16) : parseInt(numeric[2], 10));
  });
}

function parseXml(xml: string): XmlElement {
  const declaration = /^<\?xml version="1\.0" encoding="UTF-8"\?>\n/.exec(xml);
  if (!declaration) throw new Error('missing XML declaration');
  let position = declaration[0].length;
  const stack: XmlElement[] = [];
  let root: XmlElement | null = null;
  while (position < xml.length) {
    if (xml[position] !== '<') {
      const end = xml.indexOf('<', position);
      const raw = xml.slice(position, end === -1 ? xml.length : end);
      if (raw.includes(']]>')) throw new Error(']]> in character data');
      if (stack.length === 0) {
        if (raw.trim() !== '') throw new Error(`text outside the root: ${JSON.stringify(raw)}`);
      } else stack[stack.length - 1].text += decodeReferences(raw, 'text');
      position = end === -1 ? xml.length : end;
      continue;
    }
    if (xml.startsWith('</', position)) {
      const name = NAME.exec(xml.slice(position + 2))?.[0];
      const open = stack.pop();
      if (!name || !open || open.name !== name || xml[position + 2 + name.length] !== '>')
        throw new Error(`mismatched end tag at ${position}`);
      position += name.length + 3;
      if (stack.length === 0) root = open;
      continue;
    }
    const name = NAME.exec(xml.slice(position + 1))?.[0];
    if (!name) throw new Error(`bad tag at ${position}`);
    if (root || (stack.length === 0 && position !== declaration[0].length)) throw new Error('more than one root');
    position += 1 + name.length;
    const element: XmlElement = { name, attributes: {}, children: [], text: '' };
    for (;;) {
      const attribute = /^\s+([A-Za-z_][\w.-]*)="([^"<]*)"/.exec(xml.slice(position));
      if (!attribute) break;
      if (attribute[1] in element.attributes) throw new Error(`duplicate attribute ${attribute[1]}`);
      element.attributes[attribute[1]] = decodeReferences(attribute[2], `attribute ${attribute[1]}`);
      position += attribute[0].length;
    }
    if (stack.length > 0) stack[stack.length - 1].children.push(element);
    if (xml.startsWith('/>', position)) {
      position += 2;
      if (stack.length === 0) root = element;
    } else if (xml[position] === '>') {
      position += 1;
      stack.push(element);
    } else throw new Error(`unterminated tag <${name} at ${position}`);
  }
  if (stack.length > 0 || !root) throw new Error('unclosed elements');
  return root;
}

const child = (element: XmlElement, name: string) => element.children.filter((c) => c.name === name);
const suiteNamed = (root: XmlElement, path: string) =>
  child(root, 'testsuite').find((s) => s.attributes.name === path)!;
const caseNamed = (suite: XmlElement, rule: string) =>
  child(suite, 'testcase').find((c) => c.attributes.name === rule)!;

describe('toJunitXml', () => {
  it('parses as well-formed XML with one test suite per asset and one test case per rule', () => {
    const report = sampleReport();
    const root = parseXml(toJunitXml(report));
    expect(root.name).toBe('testsuites');
    const suites = child(root, 'testsuite');
    expect(suites.map((suite) => suite.attributes.name)).toEqual(report.assets.map((asset) => asset.path));
    for (const suite of suites) {
      const cases = child(suite, 'testcase');
      expect(cases.map((c) => c.attributes.name)).toEqual([...RULE_IDS]);
      expect(cases.every((c) => c.attributes.classname === suite.attributes.name)).toBe(true);
      expect(Number(suite.attributes.tests)).toBe(cases.length);
    }
  });

  it('fails a rule with warning or error findings, typed by the heaviest severity', () => {
    const keeper = 'characters/harbor-keeper.glb';
    const report = makeReport([
      makeAsset(keeper, [
        makeFinding({ severity: 'warning', keys: [2, 3], message: 'First jump.' }),
        makeFinding({ severity: 'error', keys: [8, 9], message: 'Second jump.' })
      ])
    ]);
    const suite = suiteNamed(parseXml(toJunitXml(report)), keeper);
    const [failure] = child(caseNamed(suite, 'hemisphere-jump'), 'failure');
    expect(failure.attributes.type).toBe('error');
    expect(failure.attributes.message).toBe('2 findings. First: First jump.');
    expect(failure.text.split('\n')).toHaveLength(2);
    expect(failure.text).toContain('keys 8-9');
    expect(suite.attributes.failures).toBe('1');
    expect(child(caseNamed(suite, 'unit-drift'), 'failure')).toHaveLength(0);
  });

  it('lets a rule with only info findings pass and lists them in system-out', () => {
    const suite = suiteNamed(parseXml(toJunitXml(sampleReport())), 'characters/harbor-keeper.glb');
    const redundant = caseNamed(suite, 'redundant-keys');
    expect(child(redundant, 'failure')).toHaveLength(0);
    expect(child(redundant, 'system-out')[0].text).toContain('6 keys are reproduced');
    expect(suite.attributes.failures).toBe('3'); // hemisphere-jump error, unit-drift and baked-basis warnings
  });

  it('reports an unreadable asset as a JUnit error and skips its other rules', () => {
    const suite = suiteNamed(parseXml(toJunitXml(sampleReport())), 'props/broken-buoy.glb');
    const [error] = child(caseNamed(suite, 'asset-unreadable'), 'error');
    expect(error.attributes.type).toBe('error');
    expect(error.attributes.message).toBe('The file is not a GLB: the header magic is 0x00000000.');
    expect(suite.attributes.errors).toBe('1');
    expect(suite.attributes.failures).toBe('0');
    expect(suite.attributes.skipped).toBe(String(RULE_IDS.length - 1));
    expect(child(caseNamed(suite, 'unit-drift'), 'skipped')).toHaveLength(1);
  });

  it('skips every rule of an asset the policy left out', () => {
    const report = makeReport([makeAsset('props/crate.glb', [], { skipped: true })]);
    const suite = suiteNamed(parseXml(toJunitXml(report)), 'props/crate.glb');
    expect(suite.attributes.skipped).toBe(String(RULE_IDS.length));
    expect(child(suite, 'testcase').every((c) => child(c, 'skipped').length === 1)).toBe(true);
  });

  it('adds up suite counts on the testsuites element', () => {
    const root = parseXml(toJunitXml(sampleReport()));
    for (const key of ['tests', 'failures', 'errors', 'skipped']) {
      const sum = child(root, 'testsuite').reduce((total, suite) => total + Number(suite.attributes[key]), 0);
      expect(root.attributes[key]).toBe(String(sum));
    }
    expect(root.attributes.tests).toBe(String(3 * RULE_IDS.length));
  });

  it('escapes markup characters, quotes and ]]> in names, messages and hints so they read back unchanged', () => {
    const nasty = `props/<crate> & "lid" 'n' ]]> bay.glb`;
    const message = 'Key <3> & "4" flip ]]> here.\r\nSecond line\twith a tab.';
    const finding = makeFinding({ node: '/Dock/<Crane & "Hook">', message, hint: "Use ]]> & don't <panic>." });
    const xml = toJunitXml(makeReport([makeAsset(nasty, [finding])]));
    expect(xml).not.toContain(']]>');
    const suite = parseXml(xml).children[0];
    expect(suite.attributes.name).toBe(nasty);
    const [failure] = child(caseNamed(suite, 'hemisphere-jump'), 'failure');
    expect(failure.attributes.message).toBe(message);
    expect(failure.text).toContain(`/Dock/<Crane & "Hook">`);
    expect(failure.text).toContain("Hint: Use ]]> & don't <panic>.");
    expect(failure.text).toContain('\r\nSecond line\twith a tab.');
  });

  it('replaces characters XML 1.0 cannot carry with U+FFFD', () => {
    const finding = makeFinding({ message: 'bell\u0007 nul\u0000 lone\uD800 ok' });
    const xml = toJunitXml(makeReport([makeAsset('a.glb', [finding])]));
    const [failure] = child(caseNamed(parseXml(xml).children[0], 'hemisphere-jump'), 'failure');
    expect(failure.attributes.message).toBe('bell\uFFFD nul\uFFFD lone\uFFFD ok');
  });

  it('has a small reader that really rejects malformed XML', () => {
    const prolog = '<?xml version="1.0" encoding="UTF-8"?>\n';
    expect(() => parseXml(`${prolog}<a><b></a></b>`)).toThrow();
    expect(() => parseXml(`${prolog}<a x="1 & 2"/>`)).toThrow();
    expect(() => parseXml(`${prolog}<a>x ]]> y</a>`)).toThrow();
    expect(() => parseXml(`${prolog}<a/><b/>`)).toThrow();
    expect(() => parseXml(`${prolog}<a x="1" x="2"/>`)).toThrow();
    expect(parseXml(`${prolog}<a x="&lt;&#38;&#x3e;">t&amp;</a>`)).toEqual({
      name: 'a',
      attributes: { x: '<&>' },
      children: [],
      text: 't&'
    });
  });
});
