import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { Notify } from 'quasar';

import '@quasar/extras/roboto-font/roboto-font.css';
import '@quasar/extras/material-icons/material-icons.css';
import '@fontsource/roboto-mono/400.css';
import '@fontsource/roboto-mono/500.css';
import 'quasar/dist/quasar.css';
import './css/app.css';

import App from './App.vue';
import { installQuasar } from './boot/quasar';
import { createAppRouter } from './router';
import { configureApiClient } from './api/client';
import { useAuthStore } from './stores/auth';

const app = createApp(App);
const pinia = createPinia();
app.use(pinia);
installQuasar(app);

const router = createAppRouter();
app.use(router);

configureApiClient({
  // The session ended while the reader was here: forget the user and ask them to sign in.
  onUnauthenticated: () => {
    useAuthStore(pinia).forget();
    const current = router.currentRoute.value;
    if (current.name === 'sign-in') return;
    Notify.create({
      type: 'info',
      icon: 'login',
      message: 'Your session has ended. Sign in again to carry on where you were.',
      group: 'session-ended',
    });
    void router.push({ name: 'sign-in', query: { redirect: current.fullPath } });
  },
});

void router.isReady().then(() => app.mount('#app'));
