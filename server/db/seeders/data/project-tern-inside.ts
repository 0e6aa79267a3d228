// Project Tern demo upgrades inside: cabin and electrical (invented names, part numbers, suppliers and prices; dollars).
import type { SeedUpgrade } from './project-tern';
import { BRIGHTWATER, LARKFIELD, NORTHGATE, PINECREST } from './project-tern-suppliers';

export const INSIDE_UPGRADES: SeedUpgrade[] = [
  // ---- cabin ----
  {
    key: 'headUnit', title: 'Larger-screen head unit with phone mirroring', area: 'cabin',
    replaces: '7-inch radio', becomes: '10.1-inch head unit with wireless phone mirroring',
    hours: 4, value: 1300, priority: 1, flags: ['rear_camera'], status: 'done', installedOn: '2026-10-01',
    notes: 'The rear-view camera image must show on the new screen before the vehicle leaves the bay.',
    parts: [
      { pn: 'HT-HU-9100', desc: 'Head unit, 10.1-inch', cost: 690, retail: 1149, supplier: NORTHGATE, state: 'fitted', ordered: '2026-09-08', received: '2026-09-22', url: true },
      { pn: 'HT-BZL-9101', desc: 'Dash bezel, 10.1-inch', cost: 85, retail: 149, supplier: NORTHGATE, state: 'fitted', ordered: '2026-09-08', received: '2026-09-22' },
      { pn: 'HT-ANT-9102', desc: 'Antenna and USB adapter set', cost: 34, retail: 59, supplier: LARKFIELD, state: 'fitted', ordered: '2026-09-08', received: '2026-09-17' },
    ],
    removed: [{ desc: '7-inch radio', pn: 'HT-HU-1000', disposition: 'for_sale', expected: 250 }],
  },
  {
    key: 'clockspring', title: 'Clockspring for heated wheel', area: 'cabin',
    replaces: 'Base clockspring', becomes: 'Clockspring with heater and switch circuits',
    hours: 1.5, value: 80, priority: 2, flags: ['srs_airbag'], status: 'done', installedOn: '2026-11-10',
    parts: [{ pn: 'HT-CLK-9200', desc: 'Clockspring, heated-wheel circuits', cost: 145, retail: 249, supplier: NORTHGATE, state: 'fitted', ordered: '2026-10-12', received: '2026-10-30' }],
    removed: [{ desc: 'Base clockspring', pn: 'HT-CLK-1100', disposition: 'scrapped' }],
  },
  {
    key: 'heatedWheel', title: 'Heated steering wheel', area: 'cabin',
    replaces: 'Urethane steering wheel', becomes: 'Heated leather steering wheel',
    hours: 2.5, value: 540, priority: 2, flags: ['srs_airbag'], status: 'in_bay', needs: ['clockspring'],
    parts: [
      { pn: 'HT-STW-9210', desc: 'Steering wheel, heated leather', cost: 360, retail: 599, supplier: PINECREST, condition: 'take_off', state: 'received', ordered: '2026-10-12', received: '2026-11-04', url: true },
      { pn: 'HT-HCM-9211', desc: 'Steering wheel heater module', cost: 92, retail: 159, supplier: LARKFIELD, state: 'received', ordered: '2026-10-12', received: '2026-10-30' },
    ],
    removed: [{ desc: 'Urethane steering wheel', pn: 'HT-STW-1200', disposition: 'for_sale', expected: 120 }],
  },
  {
    key: 'heatedSeats', title: 'Heated front seats', area: 'cabin',
    replaces: 'Unheated cloth seat cushions', becomes: 'Two-stage heated front seats',
    hours: 6, value: 900, priority: 2, flags: ['srs_airbag'], status: 'queued',
    notes: 'Seat occupant sensor lives in the passenger cushion: recalibrate after the swap.',
    parts: [
      { pn: 'HT-SHT-9300', desc: 'Seat heater element set, front', qty: 2, cost: 145, retail: 239, supplier: NORTHGATE, state: 'received', ordered: '2026-11-03', received: '2026-11-17' },
      { pn: 'HT-SHM-9301', desc: 'Seat heat control module', cost: 130, retail: 219, supplier: NORTHGATE, state: 'backordered', ordered: '2026-11-03', expected: '2026-12-18' },
      { pn: 'HT-SW-9302', desc: 'Seat heat switch pair', cost: 44, retail: 79, supplier: NORTHGATE, state: 'received', ordered: '2026-11-03', received: '2026-11-17' },
    ],
  },
  {
    key: 'ambient', title: 'Ambient lighting', area: 'cabin',
    replaces: null, becomes: 'Eight-zone ambient lighting in doors and footwells',
    hours: 4, value: 380, priority: 4, flags: [], status: 'queued',
    parts: [
      { pn: 'HT-AMB-9400', desc: 'Ambient light strip kit, 8 zones', cost: 160, retail: 279, supplier: BRIGHTWATER, state: 'to_order', url: true },
      { pn: 'HT-AMB-9401', desc: 'Ambient lighting controller', cost: 72, retail: 129, supplier: BRIGHTWATER, state: 'to_order' },
    ],
  },
  {
    key: 'consoleTrim', title: 'Console upper trim with charger bay', area: 'cabin',
    replaces: 'Console tray trim', becomes: 'Console upper trim with charging pad bay',
    hours: 1, value: 90, priority: 3, flags: [], status: 'done', installedOn: '2026-11-03',
    parts: [{ pn: 'HT-CNS-9500', desc: 'Console upper trim, charger bay', cost: 68, retail: 115, supplier: PINECREST, condition: 'take_off', state: 'fitted', ordered: '2026-10-15', received: '2026-10-28' }],
    removed: [{ desc: 'Console tray trim', pn: 'HT-CNS-1100', disposition: 'sold', expected: 40, actual: 35, soldOn: '2026-11-12' }],
  },
  {
    key: 'wirelessCharging', title: 'Wireless charging pad', area: 'cabin',
    replaces: null, becomes: '15 W wireless phone charging pad',
    hours: 1.5, value: 210, priority: 3, flags: [], status: 'queued', needs: ['consoleTrim'],
    parts: [{ pn: 'HT-WCP-9510', desc: 'Wireless charging pad, 15 W', cost: 115, retail: 199, supplier: NORTHGATE, state: 'ordered', ordered: '2026-11-20', expected: '2026-12-02', url: true }],
  },
  {
    key: 'autoDimMirror', title: 'Auto-dimming mirror', area: 'cabin',
    replaces: 'Manual day/night mirror', becomes: 'Auto-dimming mirror with sensor cover',
    hours: 1, value: 230, priority: 3, flags: [], status: 'done', installedOn: '2026-11-03',
    parts: [
      { pn: 'HT-MIR-9600', desc: 'Auto-dimming mirror', cost: 125, retail: 215, supplier: NORTHGATE, state: 'fitted', ordered: '2026-10-15', received: '2026-10-26', url: true },
      { pn: 'HT-HRN-9601', desc: 'Mirror harness, headliner', cost: 26, retail: 45, supplier: LARKFIELD, state: 'fitted', ordered: '2026-10-15', received: '2026-10-26' },
    ],
    removed: [{ desc: 'Manual day/night mirror', pn: 'HT-MIR-1100', disposition: 'sold', expected: 25, actual: 20, soldOn: '2026-11-18' }],
  },
  // ---- electrical ----
  {
    key: 'surroundView', title: 'Surround-view camera', area: 'electrical',
    replaces: 'Rear camera only', becomes: 'Four-camera surround view on the head unit',
    hours: 7, value: 1250, priority: 1, flags: ['rear_camera'], status: 'queued', needs: ['headUnit', 'powerMirrors'],
    parts: [
      { pn: 'HT-CAM-7100', desc: 'Camera set, front, side, rear', cost: 520, retail: 869, supplier: NORTHGATE, state: 'backordered', ordered: '2026-11-09', expected: '2026-12-29', url: true },
      { pn: 'HT-SVM-7101', desc: 'Surround-view module', cost: 310, retail: 519, supplier: NORTHGATE, state: 'ordered', ordered: '2026-11-09', expected: '2026-12-08' },
      { pn: 'HT-HRN-7102', desc: 'Camera harness set', cost: 110, retail: 189, supplier: LARKFIELD, state: 'received', ordered: '2026-11-09', received: '2026-11-25' },
    ],
  },
  {
    key: 'brakeController', title: 'Trailer brake controller', area: 'electrical',
    replaces: null, becomes: 'Integrated proportional trailer brake controller',
    hours: 2, value: 320, priority: 2, flags: ['brakes', 'high_current'], status: 'queued', needs: ['trailerWiring'],
    parts: [{ pn: 'HT-TBC-7200', desc: 'Trailer brake controller, dash-integrated', cost: 185, retail: 315, supplier: LARKFIELD, state: 'received', ordered: '2026-11-02', received: '2026-11-23', url: true }],
  },
  {
    key: 'remoteStart', title: 'Remote start', area: 'electrical',
    replaces: 'Three-button key fob', becomes: 'Remote start with four-button fob',
    hours: 2.5, value: 400, priority: 3, flags: [], status: 'queued',
    parts: [
      { pn: 'HT-RST-7300', desc: 'Remote start module', cost: 150, retail: 259, supplier: LARKFIELD, state: 'to_order' },
      { pn: 'HT-FOB-7301', desc: 'Key fob, four-button', qty: 2, cost: 55, retail: 95, supplier: NORTHGATE, state: 'to_order' },
    ],
  },
  {
    key: 'inverter', title: '400 W cargo power outlet', area: 'electrical',
    replaces: '12 V cargo socket', becomes: '120 V / 400 W cargo outlet',
    hours: 2, value: 240, priority: 4, flags: ['high_current'], status: 'queued',
    parts: [{ pn: 'HT-INV-7400', desc: 'Power inverter and outlet, 400 W', cost: 140, retail: 239, supplier: LARKFIELD, state: 'ordered', ordered: '2026-11-25', expected: '2026-12-09' }],
  },
];
