import type { App } from 'vue';
import { Quasar, Notify, Dialog, Loading, type QuasarPluginOptions } from 'quasar';

/**
 * The one palette: graphite surfaces, off-white paper, a single copper accent.
 * Status colours are muted so the copper stays the only thing that stands out.
 */
export const brand = {
  primary: '#2a2e33',
  secondary: '#3a3f45',
  accent: '#a85f36',
  dark: '#1f2226',
  'dark-page': '#1a1c1f',
  positive: '#3e6f4c',
  negative: '#a3362e',
  info: '#3f5f73',
  warning: '#8a6a1c',
} as const;

export const quasarOptions: Partial<QuasarPluginOptions> = {
  plugins: { Notify, Dialog, Loading },
  config: {
    brand: { ...brand },
    notify: { position: 'top', timeout: 6000, textColor: 'white' },
    loading: { spinnerColor: 'accent', backgroundColor: 'primary' },
  },
};

export function installQuasar(app: App): void {
  app.use(Quasar, quasarOptions);
}
