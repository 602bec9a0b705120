/** Default wording of each caution kind. Write-ups and sheets reuse these words. */
export type CautionKind = 'general' | 'battery' | 'fuel' | 'airbag' | 'high-current' | 'heat';

export interface CautionWording {
  title: string;
  text: string;
  icon: string;
}

export const CAUTION_KINDS: readonly CautionKind[] = [
  'general',
  'battery',
  'fuel',
  'airbag',
  'high-current',
  'heat',
];

export const CAUTIONS: Record<CautionKind, CautionWording> = {
  general: {
    title: 'Check before you work on any wiring',
    text:
      "Disconnect the battery first, and follow the vehicle's service information, " +
      'local regulations and licensed practice. A pinout here is a help, not a substitute.',
    icon: 'warning_amber',
  },
  battery: {
    title: 'Disconnect the battery first',
    text:
      'Disconnect the negative battery terminal before you unplug a connector, cut a wire ' +
      'or fit a terminal, and keep the cable end away from the post until you are done.',
    icon: 'battery_alert',
  },
  fuel: {
    title: 'Depressurise fuel lines before opening them',
    text:
      'Relieve fuel pressure the way the service information describes before you open a ' +
      'line or unplug a pump or injector. Work away from sparks and flames and catch spilled fuel.',
    icon: 'local_gas_station',
  },
  airbag: {
    title: 'Never probe airbag (SRS) circuits',
    text:
      'Do not put a meter, test lamp or jumper on airbag (SRS) connectors or wiring. ' +
      "Follow the service information's disarming procedure and waiting time before you work near them.",
    icon: 'health_and_safety',
  },
  'high-current': {
    title: 'Fuse every new feed close to the source',
    text:
      'Put a fuse on every new feed as close to the battery or supply point as you can, sized ' +
      'for the wire it protects, and use wire, terminals and splices rated for the current.',
    icon: 'bolt',
  },
  heat: {
    title: 'Route away from heat and moving parts',
    text:
      'Keep wiring clear of exhaust heat, sharp edges and moving parts such as pedals, steering ' +
      'and belts. Secure it along the whole run and protect it where it passes through panels.',
    icon: 'local_fire_department',
  },
};
