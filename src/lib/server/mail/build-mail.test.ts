import { describe, expect, it } from 'vitest';
import { placeOf, subjectOf, type BuildMail } from './build-mail';
import { renderBuildMailHtml } from './build-mail-html';
import { renderBuildMailText } from './build-mail-text';

const HOSTILE = '<img src=x onerror="alert(1)">';

function mail(overrides: Partial<BuildMail> = {}): BuildMail {
  return {
    kind: 'regression',
    projectName: 'Tidewatch Characters',
    branch: 'feature/new-swim-cycle',
    buildName: '#1050',
    commitSha: '41d2cf036151aa',
    verdict: 'fail',
    verdictReason: '1 new error: not-a-rotation in chars/kelp-diver.glb',
    notifySeverity: 'error',
    newFindings: [
      {
        path: 'chars/kelp-diver.glb',
        url: 'https://orientry.example/projects/tidewatch-characters/builds/7/assets/12',
        findings: [
          {
            rule: 'not-a-rotation',
            severity: 'error',
            node: '/Diver/Hips',
            animation: 'Swim',
            timeSeconds: 1,
            message: 'key 2 is (0, 0, 0, 0)'
          }
        ]
      }
    ],
    newCount: 1,
    fixedFindings: [],
    fixedCount: 0,
    reportUrl: 'https://orientry.example/projects/tidewatch-characters/builds/7',
    reason: 'lead',
    unsubscribeUrl: 'https://orientry.example/unsubscribe/3.1900000000.sig',
    profileUrl: 'https://orientry.example/profile',
    ...overrides
  };
}

describe('build e-mail', () => {
  it.each([
    { overrides: {}, expected: '[Tidewatch Characters] feature/new-swim-cycle · build #1050 failed: 1 new finding' },
    {
      overrides: { verdict: 'pass' as const, newCount: 3 },
      expected: '[Tidewatch Characters] feature/new-swim-cycle · build #1050: 3 new findings'
    },
    {
      overrides: { kind: 'fixed' as const, branch: 'main', fixedCount: 2 },
      expected: '[Tidewatch Characters] main · build #1050: 2 findings fixed'
    },
    {
      overrides: { buildName: 'nightly\r\nBcc: someone@else.example' },
      expected:
        '[Tidewatch Characters] feature/new-swim-cycle · build nightly Bcc: someone@else.example failed: 1 new finding'
    }
  ])('words the subject as $expected', ({ overrides, expected }) => {
    expect(subjectOf(mail(overrides))).toBe(expected);
  });

  it('places a finding by node, animation and time, and an asset-level one as (asset)', () => {
    const finding = mail().newFindings[0].findings[0];
    expect(placeOf(finding)).toBe('/Diver/Hips · Swim · 1.0 s');
    expect(placeOf({ ...finding, node: null, animation: null, timeSeconds: null })).toBe('(asset)');
    expect(placeOf({ ...finding, timeSeconds: 0.6666667 })).toBe('/Diver/Hips · Swim · 0.667 s');
  });

  it('escapes every name and message from the build in the HTML body, and keeps them as typed in the text', () => {
    const hostile = mail({
      projectName: `Reef ${HOSTILE}`,
      branch: `feature/${HOSTILE}`,
      buildName: HOSTILE,
      verdictReason: HOSTILE,
      newFindings: [
        {
          path: `chars/${HOSTILE}.glb`,
          url: 'https://orientry.example/a?x=1&y=2',
          findings: [
            { ...mail().newFindings[0].findings[0], node: `/${HOSTILE}`, animation: HOSTILE, message: HOSTILE }
          ]
        }
      ]
    });
    const html = renderBuildMailHtml(hostile, subjectOf(hostile));
    expect(html).not.toContain('<img');
    expect(html).not.toContain('onerror="');
    expect(html).toContain('&lt;img src=x onerror=&quot;alert(1)&quot;&gt;');
    expect(html).toContain('href="https://orientry.example/a?x=1&amp;y=2"');
    const text = renderBuildMailText(hostile);
    expect(text).toContain(`chars/${HOSTILE}.glb`);
    expect(text).toContain(`at /${HOSTILE} · ${HOSTILE} · 1.0 s`);
  });

  it('says how many findings the e-mail left out', () => {
    const text = renderBuildMailText(mail({ newCount: 31 }));
    expect(text).toContain('… and 30 more in the build report.');
    const html = renderBuildMailHtml(mail({ newCount: 31 }), 'subject');
    expect(html).toContain('… and 30 more in the');
  });

  it('tells a subscriber why the e-mail came and how to stop it, in both bodies', () => {
    const subscribed = mail({ reason: 'subscribed' });
    expect(renderBuildMailText(subscribed)).toContain(
      'You get this because you subscribed to Tidewatch Characters.\nStop these e-mails: https://orientry.example/unsubscribe/3.1900000000.sig\n'
    );
    expect(renderBuildMailHtml(subscribed, 's')).toContain(
      'href="https://orientry.example/unsubscribe/3.1900000000.sig"'
    );
  });

  it('uses no remote images, style sheets or scripts', () => {
    const html = renderBuildMailHtml(mail(), 'subject');
    expect(html).not.toMatch(/<img|<link|<script|url\(/i);
  });
});
