/** What people do to samples: each step type has its own typed parameters (shared/schemas/step.ts). */
export const STEP_TYPES = [
  'exfoliation',
  'cvd_growth',
  'transfer',
  'stacking',
  'lithography',
  'etching',
  'annealing',
  'encapsulation',
  'metal_deposition',
  'cleaving',
  'flake_search',
] as const;
export type StepType = (typeof STEP_TYPES)[number];

export const STEP_TYPE_LABELS: Record<StepType, string> = {
  exfoliation: 'Exfoliation',
  cvd_growth: 'CVD growth',
  transfer: 'Transfer',
  stacking: 'Stacking',
  lithography: 'Electron-beam lithography',
  etching: 'Plasma etching',
  annealing: 'Annealing',
  encapsulation: 'Encapsulation',
  metal_deposition: 'Metal deposition',
  cleaving: 'Cleaving',
  flake_search: 'Flake search',
};

/**
 * Short cautions shown on forms for hazardous steps. Flakeline records work; it does not
 * license it — each caution defers to the lab's own rules.
 */
export const STEP_CAUTIONS: Partial<Record<StepType, string>> = {
  cvd_growth:
    "Hot furnace, toxic and flammable gases and by-products (sulfur and selenium compounds, H2S, H2). Follow your lab's safety rules, the safety data sheets and your furnace training.",
  etching: "Plasma tool and process gases. Only trained users; follow the instrument's rules and your lab's safety office.",
  lithography:
    "Electron-beam tool, resists and developers are solvents. Follow the instrument's trained-user rules and the safety data sheets.",
  metal_deposition: "High voltage, vacuum and hot sources. Follow the instrument's trained-user rules.",
  annealing: "Hot furnace and process gases (forming gas contains hydrogen). Follow your lab's safety rules.",
  transfer: "Wet transfer may use etchants and solvents. Follow the safety data sheets and your lab's rules.",
};
