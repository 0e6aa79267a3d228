// Project Tern demo upgrades outside the cabin: front, sides, rear, wheels & chassis (invented names, part numbers, suppliers and prices; dollars).
import type { SeedUpgrade } from './project-tern';
import { BRIGHTWATER, LARKFIELD, NORTHGATE, PINECREST } from './project-tern-suppliers';

export const OUTSIDE_UPGRADES: SeedUpgrade[] = [
  // ---- front ----
  {
    key: 'headlamps', title: 'Projector LED headlamps', area: 'front',
    replaces: 'Halogen reflector headlamps', becomes: 'Projector LED headlamps with auto-levelling',
    hours: 3.5, value: 1400, priority: 1, flags: ['lighting'], status: 'done', installedOn: '2026-09-29',
    notes: 'Aim both lamps on the wall chart after fitting.',
    parts: [
      { pn: 'HT-LMP-4410-L', desc: 'Headlamp assembly, LED projector, left', cost: 410, retail: 689, supplier: NORTHGATE, state: 'fitted', ordered: '2026-09-08', received: '2026-09-18', url: true },
      { pn: 'HT-LMP-4410-R', desc: 'Headlamp assembly, LED projector, right', cost: 410, retail: 689, supplier: NORTHGATE, state: 'fitted', ordered: '2026-09-08', received: '2026-09-18', url: true },
      { pn: 'HT-HRN-2201', desc: 'Headlamp levelling harness adapter', cost: 64, retail: 119, supplier: LARKFIELD, state: 'fitted', ordered: '2026-09-08', received: '2026-09-15' },
    ],
    removed: [{ desc: 'Halogen headlamp pair', pn: 'HT-LMP-1100', disposition: 'sold', expected: 200, actual: 180, soldOn: '2026-10-14' }],
  },
  {
    key: 'lowerGrille', title: 'Lower grille with fog lamp pockets', area: 'front',
    replaces: 'Blank lower grille', becomes: 'Lower grille with fog lamp pockets and chrome strip',
    hours: 1.5, value: 220, priority: 3, flags: [], status: 'queued',
    parts: [{ pn: 'HT-GRL-3302', desc: 'Lower grille, fog lamp pockets', cost: 145, retail: 239, supplier: NORTHGATE, state: 'received', ordered: '2026-11-02', received: '2026-11-20', url: true }],
    removed: [{ desc: 'Blank lower grille', pn: 'HT-GRL-3300', disposition: 'for_sale', expected: 40 }],
  },
  {
    key: 'fogLamps', title: 'LED fog lamps', area: 'front',
    replaces: null, becomes: 'LED fog lamps with dash switch',
    hours: 2.5, value: 380, priority: 3, flags: ['lighting'], status: 'queued', needs: ['lowerGrille'],
    parts: [
      { pn: 'HT-FOG-5120', desc: 'Fog lamp pair, LED', cost: 190, retail: 329, supplier: NORTHGATE, state: 'backordered', ordered: '2026-11-02', expected: '2026-12-15', url: true },
      { pn: 'HT-HRN-5121', desc: 'Fog lamp harness and relay', cost: 48, retail: 89, supplier: LARKFIELD, state: 'received', ordered: '2026-11-02', received: '2026-11-12' },
      { pn: 'HT-SW-5122', desc: 'Fog lamp switch, dash blank replacement', cost: 22, retail: 45, supplier: NORTHGATE, state: 'received', ordered: '2026-11-02', received: '2026-11-12' },
    ],
  },
  {
    key: 'rainWipers', title: 'Rain-sensing wipers', area: 'front',
    replaces: 'Intermittent wiper control', becomes: 'Automatic rain-sensing wipers',
    hours: 2, value: 260, priority: 4, flags: [], status: 'queued', needs: ['autoDimMirror'],
    notes: 'Sensor sits in the mirror base cover; the auto-dimming mirror bracket must be in first.',
    parts: [
      { pn: 'HT-RSN-7040', desc: 'Rain and light sensor with gel pad', cost: 96, retail: 175, supplier: BRIGHTWATER, state: 'ordered', ordered: '2026-11-24', expected: '2026-12-04' },
      { pn: 'HT-WMM-7041', desc: 'Wiper control module, auto', cost: 118, retail: 199, supplier: BRIGHTWATER, state: 'ordered', ordered: '2026-11-24', expected: '2026-12-04' },
    ],
  },
  // ---- sides ----
  {
    key: 'roofRails', title: 'Roof rails', area: 'sides',
    replaces: 'Bare roof with plugged mounts', becomes: 'Factory roof rails, satin black',
    hours: 2, value: 450, priority: 2, flags: [], status: 'done', installedOn: '2026-10-06',
    parts: [{ pn: 'HT-RRL-6100', desc: 'Roof rail set, satin black', cost: 240, retail: 419, supplier: PINECREST, condition: 'take_off', state: 'fitted', ordered: '2026-09-10', received: '2026-09-24', url: true }],
    removed: [{ desc: 'Roof mount plugs (set of 8)', disposition: 'scrapped' }],
  },
  {
    key: 'crossbars', title: 'Roof crossbars', area: 'sides',
    replaces: null, becomes: 'Locking aero crossbars',
    hours: 0.75, value: 220, priority: 3, flags: [], status: 'done', installedOn: '2026-10-06', needs: ['roofRails'],
    parts: [{ pn: 'HT-XBR-6110', desc: 'Crossbar pair with locks', cost: 165, retail: 279, supplier: NORTHGATE, state: 'fitted', ordered: '2026-09-10', received: '2026-09-24', url: true }],
  },
  {
    key: 'runningBoards', title: 'Running boards', area: 'sides',
    replaces: null, becomes: 'Aluminium running boards with step pads',
    hours: 2.5, value: 520, priority: 3, flags: ['lifting'], status: 'done', installedOn: '2026-10-20',
    parts: [
      { pn: 'HT-RNB-6200', desc: 'Running board pair, aluminium', cost: 380, retail: 629, supplier: NORTHGATE, state: 'fitted', ordered: '2026-09-20', received: '2026-10-09', url: true },
      { pn: 'HT-BRK-6201', desc: 'Running board bracket kit', cost: 74, retail: 129, supplier: NORTHGATE, state: 'fitted', ordered: '2026-09-20', received: '2026-10-09' },
    ],
  },
  {
    key: 'powerMirrors', title: 'Power-folding mirrors with turn signals', area: 'sides',
    replaces: 'Manual-fold mirrors', becomes: 'Power-folding heated mirrors with turn signals and camera pockets',
    hours: 3, value: 610, priority: 2, flags: ['lighting'], status: 'queued',
    parts: [
      { pn: 'HT-MIR-6310-L', desc: 'Mirror, power-fold, camera pocket, left', cost: 265, retail: 449, supplier: PINECREST, condition: 'take_off', state: 'received', ordered: '2026-11-05', received: '2026-11-19', url: true },
      { pn: 'HT-MIR-6310-R', desc: 'Mirror, power-fold, camera pocket, right', cost: 265, retail: 449, supplier: PINECREST, condition: 'take_off', state: 'received', ordered: '2026-11-05', received: '2026-11-19', url: true },
      { pn: 'HT-HRN-6311', desc: 'Door harness extension, mirror fold', qty: 2, cost: 38, retail: 69, supplier: LARKFIELD, state: 'ordered', ordered: '2026-11-21', expected: '2026-12-03' },
    ],
    removed: [{ desc: 'Manual-fold mirror pair', pn: 'HT-MIR-1200', disposition: 'for_sale', expected: 150 }],
  },
  // ---- rear ----
  {
    key: 'rearBumper', title: 'Rear bumper cover with sensor mounts', area: 'rear',
    replaces: 'Base rear bumper cover', becomes: 'Rear bumper cover with radar and sensor mounts',
    hours: 4, value: 300, priority: 1, flags: ['lifting'], status: 'done', installedOn: '2026-10-13',
    parts: [
      { pn: 'HT-BMP-8100', desc: 'Rear bumper cover, sensor mounts, primed', cost: 330, retail: 549, supplier: PINECREST, condition: 'take_off', state: 'fitted', ordered: '2026-09-14', received: '2026-10-01', url: true },
      { pn: 'HT-PNT-8101', desc: 'Colour-match paint, bumper cover', cost: 210, retail: null, supplier: 'Cedar Ridge body shop', state: 'fitted', ordered: '2026-10-01', received: '2026-10-08' },
    ],
    removed: [{ desc: 'Base rear bumper cover', pn: 'HT-BMP-1300', disposition: 'scrapped' }],
  },
  {
    key: 'blindSpot', title: 'Blind-spot radar', area: 'rear',
    replaces: null, becomes: 'Blind-spot and rear cross-traffic radar with mirror lamps',
    hours: 5, value: 950, priority: 1, flags: [], status: 'installed', installedOn: '2026-11-24', needs: ['rearBumper'],
    parts: [
      { pn: 'HT-RDR-8210-L', desc: 'Blind-spot radar unit, left', cost: 285, retail: 479, supplier: NORTHGATE, state: 'fitted', ordered: '2026-10-20', received: '2026-11-10', url: true },
      { pn: 'HT-RDR-8210-R', desc: 'Blind-spot radar unit, right', cost: 285, retail: 479, supplier: NORTHGATE, state: 'fitted', ordered: '2026-10-20', received: '2026-11-10', url: true },
      { pn: 'HT-HRN-8211', desc: 'Radar harness, rear', cost: 92, retail: 159, supplier: LARKFIELD, state: 'fitted', ordered: '2026-10-20', received: '2026-11-06' },
    ],
  },
  {
    key: 'rearSensors', title: 'Rear parking sensors', area: 'rear',
    replaces: null, becomes: 'Four-sensor rear parking aid',
    hours: 3, value: 340, priority: 3, flags: [], status: 'queued', needs: ['rearBumper'],
    parts: [
      { pn: 'HT-PAS-8300', desc: 'Parking sensor, painted', qty: 4, cost: 38, retail: 64, supplier: NORTHGATE, state: 'backordered', ordered: '2026-11-09', expected: '2026-12-22' },
      { pn: 'HT-PAM-8301', desc: 'Parking aid module', cost: 120, retail: 205, supplier: NORTHGATE, state: 'received', ordered: '2026-11-09', received: '2026-11-23' },
    ],
  },
  {
    key: 'powerLiftgate', title: 'Power liftgate', area: 'rear',
    replaces: 'Gas-strut manual liftgate', becomes: 'Power liftgate with height memory',
    hours: 6, value: 1100, priority: 2, flags: ['high_current'], status: 'queued',
    parts: [
      { pn: 'HT-LFT-8400', desc: 'Liftgate drive strut pair', cost: 420, retail: 719, supplier: NORTHGATE, state: 'ordered', ordered: '2026-11-16', expected: '2026-12-10', url: true },
      { pn: 'HT-LFM-8401', desc: 'Liftgate control module', cost: 240, retail: 399, supplier: NORTHGATE, state: 'ordered', ordered: '2026-11-16', expected: '2026-12-10' },
      { pn: 'HT-HRN-8402', desc: 'Liftgate harness, body side', cost: 88, retail: 149, supplier: LARKFIELD, state: 'to_order' },
    ],
    removed: [{ desc: 'Liftgate gas struts', pn: 'HT-STR-1400', disposition: 'keep' }],
  },
  {
    key: 'hitch', title: 'Class III hitch receiver', area: 'rear',
    replaces: null, becomes: 'Factory 2-inch hitch receiver',
    hours: 2.5, value: 480, priority: 2, flags: ['lifting'], status: 'done', installedOn: '2026-10-27',
    parts: [{ pn: 'HT-HCH-8500', desc: 'Hitch receiver, class III', cost: 290, retail: 469, supplier: NORTHGATE, state: 'fitted', ordered: '2026-10-05', received: '2026-10-19', url: true }],
  },
  {
    key: 'trailerWiring', title: 'Trailer wiring, 7-pin', area: 'rear',
    replaces: null, becomes: '7-pin and 4-pin trailer connector with dedicated circuit',
    hours: 3, value: 260, priority: 2, flags: ['high_current'], status: 'in_bay', needs: ['hitch'],
    parts: [
      { pn: 'HT-TWH-8510', desc: 'Trailer wiring harness, 7-pin', cost: 135, retail: 229, supplier: LARKFIELD, state: 'received', ordered: '2026-11-02', received: '2026-11-16', url: true },
      { pn: 'HT-TWM-8511', desc: 'Trailer tow module', cost: 98, retail: 169, supplier: LARKFIELD, state: 'received', ordered: '2026-11-02', received: '2026-11-16' },
    ],
  },
  {
    key: 'tailLamps', title: 'LED tail lamps', area: 'rear',
    replaces: 'Bulb tail lamps', becomes: 'LED signature tail lamps',
    hours: 1.5, value: 420, priority: 4, flags: ['lighting'], status: 'queued',
    parts: [
      { pn: 'HT-TLL-8600-L', desc: 'Tail lamp, LED, left', cost: 175, retail: 299, supplier: PINECREST, condition: 'take_off', state: 'to_order' },
      { pn: 'HT-TLL-8600-R', desc: 'Tail lamp, LED, right', cost: 175, retail: 299, supplier: PINECREST, condition: 'take_off', state: 'to_order' },
    ],
    removed: [{ desc: 'Bulb tail lamp pair', pn: 'HT-TLL-1500', disposition: 'for_sale', expected: 90 }],
  },
  // ---- wheels & chassis ----
  {
    key: 'wheels20', title: '20-inch alloy wheels', area: 'wheels_chassis',
    replaces: '18-inch alloy wheels, 235/65R18', becomes: '20-inch machined alloy wheels, 255/50R20',
    hours: 2, value: 1600, priority: 1, flags: ['wheels_tires', 'lifting'], status: 'queued',
    tireFrom: '235/65R18', tireTo: '255/50R20',
    notes: 'Re-torque lug nuts after the first 50 miles.',
    parts: [
      { pn: 'HT-WHL-5200', desc: 'Alloy wheel, 20 x 8 machined', qty: 4, cost: 245, retail: 399, supplier: PINECREST, condition: 'take_off', state: 'received', ordered: '2026-10-26', received: '2026-11-13', url: true },
      { pn: 'HT-TIR-5201', desc: 'Tire 255/50R20 all-season', qty: 4, cost: 185, retail: 289, supplier: BRIGHTWATER, state: 'ordered', ordered: '2026-11-23', expected: '2026-12-07' },
      { pn: 'HT-LUG-5202', desc: 'Lug nut set, 20', cost: 42, retail: 75, supplier: NORTHGATE, state: 'received', ordered: '2026-10-26', received: '2026-11-06' },
    ],
    removed: [{ desc: '18-inch alloy wheels with 235/65R18 tires (set of 4)', pn: 'HT-WHL-1800', disposition: 'for_sale', expected: 650 }],
  },
  {
    key: 'tpms', title: 'Tire pressure sensors for 20-inch wheels', area: 'wheels_chassis',
    replaces: 'Sensors in the 18-inch wheels', becomes: 'New sensors relearned to the 20-inch set',
    hours: 1, value: 120, priority: 2, flags: ['wheels_tires'], status: 'queued', needs: ['wheels20'],
    parts: [{ pn: 'HT-TPS-5300', desc: 'Tire pressure sensor', qty: 4, cost: 42, retail: 69, supplier: NORTHGATE, state: 'received', ordered: '2026-10-26', received: '2026-11-06' }],
  },
  {
    key: 'skidPlate', title: 'Front skid plate', area: 'wheels_chassis',
    replaces: 'Plastic splash shield', becomes: 'Steel front skid plate',
    hours: 1.5, value: 260, priority: 5, flags: ['lifting'], status: 'queued',
    parts: [{ pn: 'HT-SKD-5400', desc: 'Skid plate, front, steel', cost: 160, retail: 269, supplier: NORTHGATE, state: 'to_order', url: true }],
    removed: [{ desc: 'Plastic splash shield', pn: 'HT-SPL-1100', disposition: 'keep' }],
  },
  {
    key: 'mudFlaps', title: 'Mud flaps', area: 'wheels_chassis',
    replaces: null, becomes: 'Moulded mud flaps, four corners',
    hours: 1, value: 110, priority: 5, flags: [], status: 'queued', needs: ['runningBoards'],
    notes: 'Front flaps share the running-board rear bracket holes.',
    parts: [{ pn: 'HT-MDF-5500', desc: 'Mud flap set, moulded', cost: 58, retail: 99, supplier: NORTHGATE, state: 'received', ordered: '2026-11-04', received: '2026-11-18' }],
  },
];
