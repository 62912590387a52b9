// How each host names a reading setting, so that a message says which control or option
// changes it: the reader words its messages for `SpecOptions.host`, and keeps the setting
// itself in `Problem.setting` for a host that words it again.
import type { HostKind, Setting } from './types.js';

// The pane and the page share their settings card (taskpane/settings.tsx), whose labels these
// quote; only where the table is chosen differs (a selection in Excel, a typed range on the page).
const NAMES: Readonly<Record<Setting, { readonly cli: string; readonly pane: string; readonly page?: string }>> = {
  'x-means-dont-care': { cli: '--x-means-dont-care', pane: "tick 'X means don't-care'" },
  inputs: { cli: '--inputs N', pane: "set 'Inputs: the first N columns'" },
  range: { cli: '--range A1:H20', pane: 'select the table and read the selection', page: "type the table's cells in 'Range (optional)'" },
  'dont-cares': { cli: '--dont-cares safe', pane: "choose 'Don't-cares: safe value'" },
};

/** The control or option that changes `setting`, as `host` calls it; both names for 'any'. */
export function settingName(setting: Setting, host: HostKind = 'any'): string {
  const name = NAMES[setting];
  if (host === 'cli') return `give ${name.cli}`;
  if (host === 'pane') return name.pane;
  if (host === 'page') return name.page ?? name.pane;
  return `${name.pane} (command line: ${name.cli})`;
}
