import { onBeforeUnmount, onMounted, type Ref } from 'vue';
import { useRouter } from 'vue-router';
import { Dialog } from 'quasar';

/**
 * Asks before leaving a page with unsaved edits: in-app navigation gets a dialog,
 * closing or reloading the tab gets the browser's own question. `beforeLeave` may try
 * to save first (or say the navigation is the page's own); when it resolves true, the
 * reader leaves without being asked.
 *
 * A global guard rather than onBeforeRouteLeave: the editor page stays mounted when it
 * moves from /connectors/new to /documents/:id/edit, and a leave guard would stay tied
 * to the first route.
 */
export function useLeaveGuard(
  dirty: Readonly<Ref<boolean>>,
  beforeLeave?: () => Promise<boolean>,
  message = 'Your latest changes are not saved yet. A copy stays in this browser, but other devices will not see it. Leave anyway?',
): void {
  const router = useRouter();
  let removeGuard: (() => void) | null = null;

  function onBeforeUnload(event: BeforeUnloadEvent) {
    if (!dirty.value) return;
    event.preventDefault();
    // Older browsers show the prompt only when returnValue is set.
    event.returnValue = '';
  }

  onMounted(() => {
    window.addEventListener('beforeunload', onBeforeUnload);
    removeGuard = router.beforeEach(async (to, from) => {
      if (to.path === from.path || !dirty.value) return true;
      if (beforeLeave && (await beforeLeave().catch(() => false))) return true;
      if (!dirty.value) return true;
      return new Promise<boolean>((resolve) => {
        Dialog.create({
          title: 'Leave with unsaved changes?',
          message,
          persistent: true,
          ok: { label: 'Leave', flat: true, noCaps: true, color: 'negative' },
          cancel: { label: 'Stay on this page', unelevated: true, noCaps: true, color: 'primary' },
        })
          .onOk(() => resolve(true))
          .onCancel(() => resolve(false));
      });
    });
  });
  onBeforeUnmount(() => {
    window.removeEventListener('beforeunload', onBeforeUnload);
    removeGuard?.();
  });
}
