import { onBeforeUnmount, onMounted, ref, type Ref } from 'vue';

/**
 * Whether any part of an element is on screen (or within `margin` of it). The adapter editor keeps
 * drawings that are off screen as they were and redraws them when they come into view,
 * so typing in a long table does not pay for a diagram nobody is looking at.
 */
export function useInView(el: Ref<HTMLElement | null>, margin = '0px'): Ref<boolean> {
  const inView = ref(true);
  let observer: IntersectionObserver | null = null;
  onMounted(() => {
    if (typeof IntersectionObserver === 'undefined' || !el.value) return;
    observer = new IntersectionObserver(
      (entries) => {
        for (const e of entries) inView.value = e.isIntersecting;
      },
      { rootMargin: margin },
    );
    observer.observe(el.value);
  });
  onBeforeUnmount(() => observer?.disconnect());
  return inView;
}
