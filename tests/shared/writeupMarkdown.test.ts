import { describe, expect, it } from 'vitest';
import { serverMarkdown } from '../../server/markdown';
import { outlineBody, parseCautionInfo, writeupMarkdown } from '@shared/writeup/markdown';

const md = serverMarkdown({ plugins: [writeupMarkdown] });

describe('write-up Markdown syntax', () => {
  it('renders a caution block with its kind and title', () => {
    const html = md.render(
      ':::caution fuel Relieve the rail first\nOpen the line **slowly**.\n:::\n\nAfter.',
    );
    expect(html).toContain(
      '<aside class="lw-md-caution lw-md-caution--fuel" role="note" data-kind="fuel" aria-label="Caution: Relieve the rail first">',
    );
    expect(html).toContain('<strong>slowly</strong>');
    expect(html).toMatch(/<\/aside>\s*<p>After.<\/p>/);
  });

  it('reads the kind from the first word, with aliases, and falls back to general', () => {
    expect(parseCautionInfo('caution srs')).toEqual({ kind: 'airbag', title: '' });
    expect(parseCautionInfo('caution high-current Fuse it')).toEqual({
      kind: 'high-current',
      title: 'Fuse it',
    });
    expect(parseCautionInfo('caution Mind the exhaust')).toEqual({
      kind: 'general',
      title: 'Mind the exhaust',
    });
    expect(parseCautionInfo('warning fuel')).toBeNull();
    expect(md.render(':::note\nx\n:::')).not.toContain('aside');
  });

  it('closes an unclosed block at the end, and nests lists inside', () => {
    const html = md.render(':::caution battery\n- one\n- two\n');
    expect(html).toContain('<li>one</li>');
    expect(html.trim().endsWith('</aside>')).toBe(true);
  });

  it('places an image on a line of its own as a figure, and links references in sentences', () => {
    const html = md.render(
      '![The bracket <b>](image:1)\n\nSee ![this one](image:2) and [photo 2](image:2).',
    );
    expect(html).toContain(
      '<figure class="lw-md-figure" data-ref="image:1"><figcaption>The bracket &lt;b&gt;</figcaption></figure>',
    );
    expect(html).toContain('<span class="lw-md-imgref" data-ref="image:2">this one</span>');
    expect(html).toContain('<a href="#wu-image-2">photo 2</a>');
  });

  it('renders sheet links as cards on their own line and as links in a sentence', () => {
    const html = md.render(
      '[[sheet:quorvane-t3-injector]]\n\nSee [[sheet:brindlemoor-pump|the pump plug]].',
    );
    expect(html).toContain('<div class="lw-md-sheets">');
    expect(html).toContain(
      '<a class="lw-md-sheet lw-md-sheet--card" href="/documents/quorvane-t3-injector" data-ref="sheet:quorvane-t3-injector">quorvane-t3-injector</a>',
    );
    expect(html).toContain(
      '<a class="lw-md-sheet" href="/documents/brindlemoor-pump" data-ref="sheet:brindlemoor-pump">the pump plug</a>',
    );
  });

  it('leaves malformed references as text', () => {
    for (const src of [
      '[[sheet:../../etc]]',
      '[[sheet:Bad Slug]]',
      '![x](image:0)',
      '![x](image:abc)',
      '[[sheet:]]',
    ]) {
      const html = md.render(src);
      expect(html).not.toContain('lw-md-sheet');
      expect(html).not.toContain('lw-md-figure');
      expect(html).not.toContain('<img');
    }
  });

  it('outlines blocks, references and prose for the checks', () => {
    const o = outlineBody(
      'Intro about fuel.\n\n:::caution fuel\ninside\n:::\n\n![a](image:1)\n\n[[sheet:abc]] and ![b](image:3)',
    );
    expect(o.cautions).toEqual([{ kind: 'fuel', title: '', line: 3 }]);
    expect(o.images).toEqual([
      { n: 1, line: 7, placed: true },
      { n: 3, line: 9, placed: false },
    ]);
    expect(o.sheets).toEqual([{ slug: 'abc', line: 9 }]);
    expect(o.text.map((t) => t.text)).toEqual(['Intro about fuel.', ' and ']);
  });
});
