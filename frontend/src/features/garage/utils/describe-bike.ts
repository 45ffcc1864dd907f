import type { ForkInput, ShockInput } from '@loamline/shared-types';
import { formatQuantity, type UnitPrefs } from '@/lib/units';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** "160 mm travel · 36 mm stanchions · air spring, 1 spacer · end-stroke chamber 180 psi · rated max 120 psi" */
export function describeFork(fork: ForkInput, prefs: UnitPrefs): string {
  const bits = [`${fork.travelMm} mm travel`, `${fork.stanchionMm} mm stanchions`];
  if (fork.spring === 'coil') bits.push('coil spring');
  else {
    bits.push(`air spring, ${plural(fork.spacers, 'spacer', 'spacers')}`);
    if (fork.endStroke) {
      const { pressurePsi, maxPressurePsi } = fork.endStroke;
      bits.push(
        pressurePsi === undefined
          ? 'end-stroke chamber (pressure recommended)'
          : `end-stroke chamber ${formatQuantity('pressure', pressurePsi, prefs)}`,
      );
      if (maxPressurePsi !== undefined)
        bits.push(`end-stroke max ${formatQuantity('pressure', maxPressurePsi, prefs)}`);
    }
    if (fork.maxPressurePsi !== undefined)
      bits.push(`rated max ${formatQuantity('pressure', fork.maxPressurePsi, prefs)}`);
  }
  return bits.join(' · ');
}

/** "65 mm stroke · 165 mm wheel travel · air spring, 0 spacers · rated max 350 psi" */
export function describeShock(shock: ShockInput, prefs: UnitPrefs): string {
  const bits = [`${shock.strokeMm} mm stroke`, `${shock.wheelTravelMm} mm wheel travel`];
  if (shock.spring === 'coil') bits.push('coil spring');
  else {
    bits.push(`air spring, ${plural(shock.spacers, 'spacer', 'spacers')}`);
    if (shock.maxPressurePsi !== undefined) {
      bits.push(`rated max ${formatQuantity('pressure', shock.maxPressurePsi, prefs)}`);
    }
  }
  return bits.join(' · ');
}
