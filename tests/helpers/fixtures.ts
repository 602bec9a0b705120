import type { ConnectorContent } from '../../shared/schemas/connector';

/** An invented three-way sensor plug, complete enough to submit and publish. */
export function threeWaySensor(over: Partial<ConnectorContent> = {}): ConnectorContent {
  return {
    cavities: ['A', 'B', 'C'],
    layout: { rows: 1, cols: 3 },
    housing: 'socket',
    view: 'wire-side',
    sealed: true,
    component: 'coolant temperature sensor',
    tags: ['Brindlemoor 4.2 platform'],
    wireSize: { min: '22 AWG', max: '18 AWG' },
    pins: [
      { cavity: 'A', role: '5 V reference', color: 'GY', size: '20 AWG', circuit: '', note: '' },
      { cavity: 'B', role: 'signal', color: 'GN/YE', size: '20 AWG', circuit: '', note: '' },
      { cavity: 'C', role: 'low reference', color: 'BK/WH', size: '20 AWG', circuit: '', note: '' },
    ],
    ...over,
  };
}
