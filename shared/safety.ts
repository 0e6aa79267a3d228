// Short safety cautions for flagged upgrades, shown on the backlog, the shop floor, the public page and show notes.
// Written in our own words (DESIGN.md §6): they point people to the authoritative sources, never replace them.
import { SAFETY_FLAGS, type SafetyFlag } from './domain';

export interface SafetyCaution {
  label: string;
  caution: string;
}

export interface FlagCaution extends SafetyCaution {
  flag: SafetyFlag;
}

// Every caution ends with the same deferral so no flag can forget it: our note is a reminder,
// the vehicle maker's service information, local codes and licensed practice are the authority.
export const SAFETY_DEFERRAL =
  "Follow the vehicle maker's service information, local codes and licensed practice; where they differ from this note, they win.";

function caution(label: string, specific: string): SafetyCaution {
  return { label, caution: `${specific} ${SAFETY_DEFERRAL}` };
}

export const SAFETY_CAUTIONS: Record<SafetyFlag, SafetyCaution> = {
  srs_airbag: caution(
    'Airbag (SRS)',
    'This work is close to airbag parts such as the steering-wheel module, clockspring or seat sensors, which can fire with great force if handled live. ' +
      'Cut power and wait the stated time before unplugging any airbag connector, and make sure the airbag warning lamp goes out once the job is done.',
  ),
  brakes: caution(
    'Brakes and trailer brakes',
    'A fault here can leave the vehicle or its trailer unable to stop. ' +
      'Use the specified torque, fluid and bleeding steps, set any trailer brake controller up for the actual load, and test at low speed in a safe place before the vehicle goes back on the road.',
  ),
  lighting: caution(
    'Exterior lighting',
    'Headlamps and other outside lamps have to meet the federal lamp rules and any local inspection rules, and they need aiming after they are fitted. ' +
      'Use lamps made for this vehicle, aim them as specified and check every function works before driving at night.',
  ),
  rear_camera: caution(
    'Rear-view camera',
    'On newer vehicles the backing-up view is covered by federal rules on what it shows and how quickly it appears. ' +
      'After changing the camera or the screen, confirm the rear image still comes up promptly and clearly every time reverse is selected.',
  ),
  wheels_tires: caution(
    'Wheels and tires',
    'Tighten wheel fasteners to the specified torque in a star pattern and check them again after the first short drive. ' +
      "Tires must carry at least the load and speed rating on the vehicle's placard, and a change of size can affect clearance, the speedometer and stability systems.",
  ),
  high_current: caution(
    'High-current electrical',
    'Circuits such as trailer wiring, inverters and powered accessories carry enough current to start a fire through an undersized wire, a missing fuse or a chafed loom. ' +
      'Disconnect the battery first, fuse close to the source, and route wiring clear of sharp edges, heat and moving parts.',
  ),
  lifting: caution(
    'Lifting the vehicle',
    'Raise the vehicle only at its specified lift points, on equipment rated for its weight, and never work under it while it rests on a jack alone. ' +
      "Follow the lift maker's instructions and re-check the contact pads once the wheels leave the ground.",
  ),
};

function isSafetyFlag(value: unknown): value is SafetyFlag {
  return typeof value === 'string' && (SAFETY_FLAGS as readonly string[]).includes(value);
}

/**
 * Cautions for a set of flags, each once, in the fixed SAFETY_FLAGS order so screens and show
 * notes always list them the same way. Unknown strings (e.g. from an older record) are skipped
 * rather than thrown on: a caution list must never break the page it sits on.
 */
export function cautionsFor(flags: readonly (SafetyFlag | string)[] | null | undefined): FlagCaution[] {
  const wanted = new Set((flags ?? []).filter(isSafetyFlag));
  return SAFETY_FLAGS.filter((f) => wanted.has(f)).map((flag) => ({ flag, ...SAFETY_CAUTIONS[flag] }));
}
