/**
 * A write-up's Markdown, rendered and sanitised with the same renderer as the server,
 * then turned into Vue nodes so caution blocks, placed images and sheet cards become
 * their components. Only elements and attributes the sanitiser let through are copied.
 */
import { computed, defineComponent, h, type PropType, type VNodeChild } from 'vue';
import { ALLOWED_ATTR } from '@shared/markdown/render';
import { MD_CLASSES, cautionKindOf } from '@shared/writeup/markdown';
import type { WriteupImage } from '@shared/schemas/writeup';
import { useMarkdown } from '@/composables/useMarkdown';
import CautionBlock from '@/components/CautionBlock.vue';
import type { CautionKind } from '@/components/cautions';
import { writeupMarkdown } from '@shared/writeup/markdown';
import AnnotatedImage from './AnnotatedImage.vue';
import SheetCard from './SheetCard.vue';
import './writeupBody.css';

let renderer: ReturnType<typeof useMarkdown> | undefined;

/** The browser's write-up renderer (one per page). */
export function writeupRenderer() {
  renderer ??= useMarkdown({ plugins: [writeupMarkdown] });
  return renderer;
}

const KEPT_ATTRS = new Set(ALLOWED_ATTR.filter((a) => a !== 'class'));
const VOID = new Set(['br', 'hr', 'img']);

export interface BodyParts {
  figure(n: number, caption: string): VNodeChild;
  caution(kind: CautionKind, title: string, children: VNodeChild[]): VNodeChild;
  sheet(slug: string, label: string, card: boolean): VNodeChild;
  imageRef(n: number, text: string): VNodeChild;
}

function attrsOf(el: Element): Record<string, string> {
  const out: Record<string, string> = {};
  for (const a of Array.from(el.attributes)) {
    if (a.name === 'class') out.class = a.value;
    else if (KEPT_ATTRS.has(a.name)) out[a.name] = a.value;
  }
  return out;
}

function convert(node: Node, parts: BodyParts): VNodeChild {
  if (node.nodeType === Node.TEXT_NODE) return node.textContent ?? '';
  if (node.nodeType !== Node.ELEMENT_NODE) return null;
  const el = node as Element;
  const tag = el.tagName.toLowerCase();
  const cls = el.classList;
  const ref = el.getAttribute('data-ref') ?? '';
  if (tag === 'figure' && cls.contains(MD_CLASSES.figure)) {
    const n = Number(/^image:(\d+)$/.exec(ref)?.[1] ?? 0);
    return parts.figure(n, el.querySelector('figcaption')?.textContent ?? '');
  }
  if (tag === 'aside' && cls.contains(MD_CLASSES.caution)) {
    const kind = (cautionKindOf(el.getAttribute('data-kind') ?? '') ?? 'general') as CautionKind;
    const heading = el.querySelector(`.${MD_CLASSES.cautionTitle}`);
    const title = /^Caution: (.*)$/.exec(heading?.textContent ?? '')?.[1] ?? '';
    const kids = Array.from(el.childNodes)
      .filter((c) => c !== heading)
      .map((c) => convert(c, parts));
    return parts.caution(kind, title, kids);
  }
  if (tag === 'a' && cls.contains(MD_CLASSES.sheet)) {
    const slug = /^sheet:(.+)$/.exec(ref)?.[1] ?? '';
    return parts.sheet(slug, el.textContent ?? '', cls.contains(MD_CLASSES.sheetCard));
  }
  if (tag === 'span' && cls.contains(MD_CLASSES.imageRef)) {
    const n = Number(/^image:(\d+)$/.exec(ref)?.[1] ?? 0);
    return parts.imageRef(n, el.textContent ?? '');
  }
  const attrs = attrsOf(el);
  if (VOID.has(tag)) return h(tag, attrs);
  return h(
    tag,
    attrs,
    Array.from(el.childNodes).map((c) => convert(c, parts)),
  );
}

/** Sanitised HTML of the renderer as Vue nodes, with the write-up's elements swapped for `parts`. */
export function htmlToVNodes(html: string, parts: BodyParts): VNodeChild[] {
  const doc = new DOMParser().parseFromString(`<!doctype html><body>${html}</body>`, 'text/html');
  return Array.from(doc.body.childNodes).map((c) => convert(c, parts));
}

/** Renders a write-up body; unknown image numbers show a note instead of a photo. */
export default defineComponent({
  name: 'WriteupBody',
  props: {
    body: { type: String, required: true },
    images: { type: Array as PropType<WriteupImage[]>, default: () => [] },
    showMarkings: { type: Boolean, default: true },
    downloadable: { type: Boolean, default: true },
  },
  setup(props) {
    const rendered = computed(() => {
      try {
        return { html: writeupRenderer().render(props.body), error: null as string | null };
      } catch (e) {
        return { html: '', error: e instanceof Error ? e.message : 'The text cannot be shown.' };
      }
    });
    const parts: BodyParts = {
      figure(n, caption) {
        const image = props.images[n - 1];
        if (!image)
          return h('p', { class: 'lw-wbody__missing', role: 'note' }, [
            `Image ${n} is placed here, but the write-up has no image ${n}.`,
          ]);
        return h(AnnotatedImage, {
          image,
          number: n,
          caption,
          showMarkings: props.showMarkings,
          downloadable: props.downloadable,
        });
      },
      caution(kind, title, children) {
        return h(CautionBlock, { kind, title: title || undefined }, { default: () => children });
      },
      sheet(slug, label, card) {
        return h(SheetCard, { slug, label: label === slug ? '' : label, card });
      },
      imageRef(n, text) {
        return h('a', { href: `#wu-image-${n}`, class: 'lw-wbody__imgref' }, [
          text,
          h('span', { class: 'lw-wbody__imgnum' }, ` (image ${n})`),
        ]);
      },
    };
    return () => {
      const r = rendered.value;
      if (r.error) return h('div', { class: 'lw-wbody', role: 'alert' }, [h('p', r.error)]);
      return h('div', { class: 'lw-wbody' }, htmlToVNodes(r.html, parts));
    };
  },
});
