/**
 * Typed view of the user settings. Defaults live only in schema/settings/plugin.json;
 * the setting registry fills them in, and this module only checks the types.
 */

/** psiscape's user settings. */
export interface IPsiscapeSettings {
  /** Area of a data point in px². */
  pointSize: number;
  /** Where a new analysis panel opens: beside the notebook (later panels as tabs there), or as a tab next to the notebook. */
  placement: 'beside' | 'tab';
  /** Size factor of chart text, lines and points in the presenter view. */
  presenterScale: number;
}

/**
 * Settings from the registry's composite (user values over schema defaults).
 *
 * @throws TypeError naming the setting when a value has the wrong type, which
 * means the composite did not come from a registry that validated it.
 */
export function readSettings(composite: Readonly<Record<string, unknown>>): IPsiscapeSettings {
  const { pointSize, placement, presenterScale } = composite;
  if (typeof pointSize !== 'number' || !Number.isFinite(pointSize)) {
    throw new TypeError(`setting "pointSize" must be a finite number, got ${JSON.stringify(pointSize)}`);
  }
  if (placement !== 'beside' && placement !== 'tab') {
    throw new TypeError(`setting "placement" must be "beside" or "tab", got ${JSON.stringify(placement)}`);
  }
  if (typeof presenterScale !== 'number' || !Number.isFinite(presenterScale) || presenterScale <= 0) {
    throw new TypeError(`setting "presenterScale" must be a positive number, got ${JSON.stringify(presenterScale)}`);
  }
  return { pointSize, placement, presenterScale };
}
