// The riding choices' words, apart from the wizard step that asks them: the sheet and the summary
// show them too and should not load the step's inputs.
import type { RidingFeel, RidingStyle } from '@loamline/shared-types';
import type { Choice } from '../components/form-fields';

export const STYLE_CHOICES: readonly Choice<RidingStyle>[] = [
  { value: 'cross-country', label: 'Cross-country', hint: 'Long climbs, fast and efficient' },
  { value: 'trail', label: 'Trail', hint: 'A bit of everything, up and down' },
  { value: 'enduro', label: 'Enduro', hint: 'Steep, rough descents; climbing to get there' },
  { value: 'downhill', label: 'Downhill', hint: 'Lift or shuttle, big hits at speed' },
  { value: 'park', label: 'Park / jump', hint: 'Jumps, drops and berms' },
];

export const FEEL_CHOICES: readonly Choice<RidingFeel>[] = [
  { value: 'supple', label: 'Supple', hint: 'More sag: smooth over small bumps and roots' },
  { value: 'balanced', label: 'Balanced', hint: 'The middle of the range for your riding' },
  { value: 'firm', label: 'Firm', hint: 'Less sag: more support to push and pump' },
];
