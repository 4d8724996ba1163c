/** Colours of the 3D bench, from the palette in tailwind.config.ts (the scene cannot read Tailwind classes). */
export const SCENE_COLOURS = {
  /** ink-950: the viewport, dark so copper and field colours read clearly */
  background: '#10151e',
  /** copper-500 / copper-300: the two windings */
  transmitter: '#c9662b',
  receiver: '#e9a573',
  /** flux-400 / flux-200: drag handles; flux-300 for the receiver axis */
  handle: '#44b5b3',
  handleActive: '#ade6e3',
  axisLine: '#77d1ce',
  /** ink-700 / ink-500: ground grid */
  gridCell: '#3b4960',
  gridSection: '#60738f',
  /** caution-500: the operator point */
  operator: '#d98e04',
  /** muted x, y, z axes */
  axisX: '#e0442c',
  axisY: '#5fb36a',
  axisZ: '#4f8fdc',
} as const;
