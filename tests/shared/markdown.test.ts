import { describe, expect, it } from 'vitest';
import { executableParts } from '../helpers/xssPayloads';
import { serverMarkdown } from '../../server/markdown';

const md = serverMarkdown();

describe('Markdown rendering', () => {
  it('renders ordinary Markdown', () => {
    const html = md.render('# Relocating the sensor\n\nCut **one** wire.\n\n- a\n- b');
    expect(html).toContain('<h1>Relocating the sensor</h1>');
    expect(html).toContain('<strong>one</strong>');
    expect(html).toContain('<li>a</li>');
  });

  it('keeps http(s) links with rel=nofollow and the site\u2019s own paths', () => {
    const html = md.render('[a](https://example.test/x) [b](/documents/pump-plug)');
    expect(html).toContain('href="https://example.test/x"');
    expect(html).toMatch(/rel="nofollow noopener noreferrer"/);
    expect(html).toContain('href="/documents/pump-plug"');
  });

  it.each([
    '<script>alert(1)</script>',
    '<img src=x onerror=alert(1)>',
    '[x](javascript:alert(1))',
    '[x](JaVaScRiPt:alert(1))',
    '[x](java\tscript:alert(1))',
    '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
    '![x](javascript:alert(1))',
    '[x](//evil.example/steal)',
    '<svg onload=alert(1)>',
    '<math><mi xlink:href="javascript:alert(1)">x</mi></math>',
    '<iframe src="https://evil.example"></iframe>',
    '<a href="javascript:alert(1)">x</a>',
    '<<script>alert(1)//<</script>',
  ])('renders nothing executable from %s', (payload) => {
    expect(executableParts(md.render(payload))).toEqual([]);
  });

  it('refuses text too long to render quickly', () => {
    expect(() => md.render('a'.repeat(100_001))).toThrow(RangeError);
  });
});
