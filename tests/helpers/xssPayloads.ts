import { JSDOM } from 'jsdom';

/** Script tags, event handlers, javascript: and data: links, SVG and MathML tricks, broken tags, and our own syntax abused. */
export const XSS_PAYLOADS = [
  '<script>alert(1)</script>',
  '<SCRIPT SRC=//evil.example/x.js></SCRIPT>',
  '<img src=x onerror=alert(1)>',
  '<body onload=alert(1)>',
  '<a href="javascript:alert(1)">x</a>',
  '[x](javascript:alert(1))',
  '[x](JaVaScRiPt:alert(1))',
  '[x](java\tscript:alert(1))',
  '[x](&#106;avascript:alert(1))',
  '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
  '![x](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+)',
  '![x](javascript:alert(1))',
  '[x](vbscript:msgbox(1))',
  '[x](//evil.example/steal)',
  '<svg onload=alert(1)>',
  '<svg><script>alert(1)</script></svg>',
  '<svg><a xlink:href="javascript:alert(1)"><text>x</text></a></svg>',
  '<math><mi xlink:href="javascript:alert(1)">x</mi></math>',
  '<math><maction actiontype="statusline" xlink:href="javascript:alert(1)">x</maction></math>',
  '<iframe src="javascript:alert(1)"></iframe>',
  '<object data="javascript:alert(1)"></object>',
  '<<script>alert(1)//<</script>',
  '<img src="x" onerror="alert(1)"',
  '<a href="javascript:alert(1)"',
  '</p><script>alert(1)</script><p>',
  '<style>@import "javascript:alert(1)";</style>',
  '<div style="background:url(javascript:alert(1))">x</div>',
  '<form action="javascript:alert(1)"><button>x</button></form>',
  '<details open ontoggle=alert(1)>',
  '[x]: javascript:alert(1)\n\n[click][x]',
  ':::caution fuel <img src=x onerror=alert(1)>\nx\n:::',
  ':::caution "><script>alert(1)</script>\nx\n:::',
  '![<img src=x onerror=alert(1)>](image:1)',
  '![x" onerror="alert(1)](image:1)',
  '[[sheet:<script>alert(1)</script>]]',
  '[[sheet:x" onmouseover="alert(1)]]',
  '[[sheet:abc|<svg onload=alert(1)>]]',
  '[[sheet:javascript:alert(1)]]',
  '[click](image:1" onclick="alert(1))',
];

/** Everything in rendered HTML that could run script: elements, handlers, script URLs. */
export function executableParts(html: string): string[] {
  const doc = new JSDOM(`<body>${html}</body>`).window.document;
  const found: string[] = [];
  for (const el of doc.body.querySelectorAll('*')) {
    const tag = el.tagName.toLowerCase();
    if (
      [
        'script',
        'iframe',
        'svg',
        'math',
        'object',
        'embed',
        'style',
        'form',
        'meta',
        'base',
        'link',
        'foreignobject',
      ].includes(tag)
    )
      found.push(`<${tag}>`);
    for (const attr of el.attributes) {
      if (/^on/i.test(attr.name)) found.push(`${tag}[${attr.name}]`);
      if (attr.name === 'style') found.push(`${tag}[style]`);
      if (
        ['href', 'src', 'action', 'xlink:href', 'formaction', 'srcset'].includes(attr.name) &&
        !/^(https?:\/\/|\/(?!\/)|#)/i.test(attr.value)
      )
        found.push(`${tag}[${attr.name}=${attr.value}]`);
    }
  }
  return found;
}
