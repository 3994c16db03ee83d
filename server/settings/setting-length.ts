// A length the owner typed into the shop settings, read where a rule needs it. The settings form
// already refuses a bad one, so a bad value here means the stored settings were changed by hand.
import { Conflict } from '../errors';
import { parseLength, type Nm } from '../../shared/lengths';

/** The setting's length in nm, or null when it is left empty. */
export function settingLength(name: string, text: string): Nm | null {
  if (text.trim() === '') return null;
  const parsed = parseLength(text);
  if (!parsed.ok) {
    throw new Conflict(
      `The shop setting "${name}" ("${text}") is not a length: ${parsed.message} The owner sets it under Settings.`,
      'bad_setting',
    );
  }
  return parsed.nm;
}

/** Like settingLength, for a setting the rule cannot do without. */
export function requiredSettingLength(name: string, text: string): Nm {
  const nm = settingLength(name, text);
  if (nm === null) {
    throw new Conflict(
      `The shop has no ${name} set; the owner sets it under Settings.`,
      'bad_setting',
    );
  }
  return nm;
}
