/**
 * The demo jobs' records: everything on the certificate and the report around the schedules, for
 * the invented scenario of demo-scenario.ts (Kestrel Vale Electrical Ltd, a house rewire certified
 * by an EIC and a bakery's condition report). Pure data, no database.
 *
 * Observations name their board and circuit by reference and number (ids are not known until the
 * seed inserts them). The bakery's report has observations of every code, one a C2 on the circuit
 * of the planted Zs fault, and every inspection item coded C1, C2 or C3 has its observation.
 */
import type { JobSectionData, Observation } from '../../../shared/schemas/job-record.ts';

/** An observation of the demo, tied to a board and circuit by their reference and number. */
export type DemoObservation = Omit<Observation, 'boardId' | 'circuitId'> & {
  boardReference: string | null;
  circuitNumber: string | null;
};

/** A demo job's record: the sections of its kind, observations tied by reference. */
export type DemoJobRecord = Partial<Omit<JobSectionData, 'observations'>> & {
  observations?: Record<string, DemoObservation>;
};

const person = (name: string, position: string, date: string) => ({ name, position, date });
const nobody = person('', '', '');

// ---------------------------------------------------------------------------------------------
// The house rewire (EIC): new work, all acceptable
// ---------------------------------------------------------------------------------------------

export const houseEicRecord: DemoJobRecord = {
  client: {
    orderedBy: 'Ms Rowena Penhallow',
    orderedByAddress: '14 Quarry Bank Road, Thornleigh, TL4 7QX',
    reason: null,
    reasonDetail: '',
  },
  installation: {
    premises: 'domestic',
    wiringAgeYears: 0,
    alterationsEvident: 'no',
    alterationsAgeYears: null,
    recordsAvailable: 'yes',
    recordsHeldBy: 'The client: this certificate, the circuit chart and the makers’ instructions for the consumer unit and alarms.',
    lastInspectionDate: '',
  },
  work: {
    description:
      'Full rewire of the house during its refurbishment: new consumer unit CU1 with an RCBO for each circuit, new cooker, shower, ' +
      'socket, lighting, alarm and heating circuits, a radial to the garage and an armoured cable to the garden office.',
    extent: 'Every circuit of consumer unit CU1 (14 circuits, including the unfused spur to the garage freezer). The supplier’s cut-out and meter are not part of the work.',
    departures: 'None.',
    existingInstallationComments:
      'The supplier’s cut-out, meter and 25 mm² meter tails were kept; the cut-out is in good order and its seal intact. Nothing of the old wiring remains in use.',
  },
  supply: {
    earthing: 'TN-C-S',
    liveConductors: '1-phase 2-wire',
    u0V: 230,
    uV: 230,
    frequencyHz: 50,
    zeOhm: 0.21,
    ipfKa: 1.4,
    supplyDeviceStandard: 'BS 88-3',
    supplyDeviceType: 'cartridge fuse',
    supplyDeviceRatingA: 100,
    supplyNeutralCsaMm2: 25,
  },
  origin: {
    meansOfEarthing: 'supplier',
    electrodeType: '',
    electrodeLocation: '',
    electrodeRaOhm: null,
    mainSwitchStandard: 'BS EN 60947-3',
    mainSwitchPoles: 2,
    mainSwitchRatingA: 100,
    mainSwitchRcdMa: null,
    mainSwitchRcdTimeMs: null,
    earthingConductorMaterial: 'copper',
    earthingConductorCsaMm2: 16,
    earthingConductorVerified: 'yes',
    bondingConductorMaterial: 'copper',
    bondingConductorCsaMm2: 10,
    bondingVerified: 'yes',
    bondedWater: 'yes',
    bondedGas: 'yes',
    bondedOil: 'none',
    bondedStructuralSteel: 'none',
    bondedLightningProtection: 'none',
    bondedOther: '',
  },
  extent: {
    extentCovered: 'The whole of the new installation: consumer unit CU1 in the hall cupboard and its 14 circuits, in the house, garage and garden office.',
    agreedWith: '',
    limitations: [
      {
        kind: 'operational',
        what: 'Insulation resistance between live conductors of circuit 11 (boiler and heating controls).',
        reason: 'The boiler’s control board could not be disconnected; line and neutral together to earth were tested instead.',
      },
    ],
  },
  inspections: {
    '1.1': 'ok', '1.2': 'ok', '1.3': 'ok', '1.4': 'N/A',
    '2.1': 'N/A', '2.2': 'N/A',
    '3.1': 'ok', '3.2': 'N/A', '3.3': 'ok', '3.4': 'ok', '3.5': 'N/A',
    '4.1': 'ok', '4.2': 'ok', '4.3': 'ok', '4.4': 'ok', '4.5': 'ok', '4.6': 'ok', '4.7': 'ok', '4.8': 'ok', '4.9': 'ok', '4.10': 'ok',
    '5.1': 'ok', '5.2': 'ok', '5.3': 'ok', '5.4': 'ok', '5.5': 'ok', '5.6': 'ok', '5.7': 'ok', '5.8': 'ok',
    '6.1': 'ok', '6.2': 'ok', '6.3': 'ok', '6.4': 'ok',
    '7.1': 'N/A', '7.2': 'N/A', '7.3': 'N/A',
  },
  summary: {
    generalCondition: 'New installation, inspected and tested on completion; every circuit met the requirements checked.',
    nextInspectionMonths: 120,
    nextInspectionReason: '',
  },
  declaration: {
    samePersonForAll: false,
    designer: person('Ruth Okafor-Lane', 'Qualified supervisor', '2026-11-18'),
    constructor: person('Callum Brierley', 'Electrician', '2026-11-18'),
    inspector: person('Callum Brierley', 'Electrician, inspection and testing', '2026-11-18'),
    reviewer: nobody,
  },
};

// ---------------------------------------------------------------------------------------------
// The bakery (EICR): a condition report with observations of every code
// ---------------------------------------------------------------------------------------------

const mdb = 'MDB-1';

export const bakeryEicrRecord: DemoJobRecord = {
  client: {
    orderedBy: 'Corbel Bakehouse Ltd (Priya Venkatesan, facilities manager)',
    orderedByAddress: 'Unit 6, Saltmarsh Trading Estate, Fenwick Road, Ashby Marsh, AM3 9RD',
    reason: 'periodic',
    reasonDetail: 'Periodic inspection asked for by the landlord’s insurer; the last report is five years old.',
  },
  installation: {
    premises: 'commercial',
    wiringAgeYears: 14,
    alterationsEvident: 'yes',
    alterationsAgeYears: 3,
    recordsAvailable: 'yes',
    recordsHeldBy: 'Facilities manager: the previous condition report (2021) and the certificate for the 2023 shop refit.',
    lastInspectionDate: '2021-10-12',
  },
  supply: {
    earthing: 'TN-S',
    liveConductors: '3-phase 4-wire',
    u0V: 230,
    uV: 400,
    frequencyHz: 50,
    zeOhm: 0.11,
    ipfKa: 8.2,
    supplyDeviceStandard: 'BS 88-2',
    supplyDeviceType: 'gG',
    supplyDeviceRatingA: 200,
    supplyNeutralCsaMm2: 95,
  },
  origin: {
    meansOfEarthing: 'supplier',
    electrodeType: '',
    electrodeLocation: '',
    electrodeRaOhm: null,
    mainSwitchStandard: 'BS EN 60947-3',
    mainSwitchPoles: 4,
    mainSwitchRatingA: 125,
    mainSwitchRcdMa: null,
    mainSwitchRcdTimeMs: null,
    earthingConductorMaterial: 'copper',
    earthingConductorCsaMm2: 25,
    earthingConductorVerified: 'yes',
    bondingConductorMaterial: 'copper',
    bondingConductorCsaMm2: 16,
    bondingVerified: 'yes',
    bondedWater: 'yes',
    bondedGas: 'no',
    bondedOil: 'none',
    bondedStructuralSteel: 'yes',
    bondedLightningProtection: 'none',
    bondedOther: 'Compressed-air pipework at the compressor',
  },
  extent: {
    extentCovered:
      'The installation fed from main board MDB-1: production floor, shop, goods-in, warehouse and yard. Sub-boards DB-3 (yard store) and ' +
      'DB-4 (despatch) inspected visually only; DB-2 (first-floor offices) left out, see the limitations.',
    agreedWith: 'Priya Venkatesan, facilities manager, on 2026-11-17',
    limitations: [
      {
        kind: 'agreed',
        what: 'Accessories: a sample of one in five inspected and tested in each area.',
        reason: 'Agreed to keep production running; the sample covers every area and every circuit type.',
      },
      {
        kind: 'agreed',
        what: 'Sub-board DB-2 (first-floor offices) and its circuits.',
        reason: 'Let to a separate tenant, who has asked for a report of their own.',
      },
      {
        kind: 'operational',
        what: 'Cables concealed in walls, floors and above the fixed ceiling of the shop.',
        reason: 'Not reachable without damage to the building fabric.',
      },
      {
        kind: 'operational',
        what: 'Refrigeration circuits (cold room, blast chiller, display chiller): tested only after trading hours.',
        reason: 'Stock could not be left without cooling during the day.',
      },
    ],
  },
  inspections: {
    '1.1': 'ok', '1.2': 'ok', '1.3': 'C2', '1.4': 'ok',
    '2.1': 'N/A', '2.2': 'N/A',
    '3.1': 'ok', '3.2': 'N/A', '3.3': 'C2', '3.4': 'ok', '3.5': 'N/A',
    '4.1': 'ok', '4.2': 'N/A', '4.3': 'ok', '4.4': 'ok', '4.5': 'C3', '4.6': 'C3', '4.7': 'C3', '4.8': 'C3', '4.9': 'N/A', '4.10': 'ok',
    '5.1': 'C2', '5.2': 'ok', '5.3': 'LIM', '5.4': 'C1', '5.5': 'ok', '5.6': 'not-verified', '5.7': 'ok', '5.8': 'ok',
    '6.1': 'N/A', '6.2': 'N/A', '6.3': 'N/A', '6.4': 'N/A',
    '7.1': 'N/A', '7.2': 'N/A', '7.3': 'N/A',
  },
  observations: {
    'o-1': {
      number: 1,
      text: 'Local isolator of the dough divider has lost its terminal cover: live terminals within reach of the operator. Isolated and taped off on the day; the manager was told.',
      location: 'Production floor, beside the dough divider',
      code: 'C1',
      boardReference: mdb,
      circuitNumber: '5L3',
      inspectionItem: '5.4',
    },
    'o-2': {
      number: 2,
      text: 'Socket-outlet by the racking crushed by a pallet truck: face plate broken, live parts showing. Switched off and labelled on the day.',
      location: 'Warehouse, bay 3 racking',
      code: 'C1',
      boardReference: mdb,
      circuitNumber: '17L2',
      inspectionItem: '5.4',
    },
    'o-3': {
      number: 3,
      text:
        'Canopy heaters: measured Zs 1.52 Ω is over the 1.37 Ω maximum for the B32 circuit-breaker, so disconnection within 0.4 s is not ' +
        'assured (84 m of 4 mm² with a 1.5 mm² cpc). Protect with a device that meets the limit, or reduce the loop impedance.',
      location: 'Loading-bay canopy',
      code: 'C2',
      boardReference: mdb,
      circuitNumber: '6L1',
      inspectionItem: '5.1',
    },
    'o-4': {
      number: 4,
      text: 'No main protective bonding to the incoming gas pipe: the clamp at the meter is missing and the bonding conductor is cut short.',
      location: 'Gas meter housing, rear yard',
      code: 'C2',
      boardReference: null,
      circuitNumber: null,
      inspectionItem: '3.3',
    },
    'o-5': {
      number: 5,
      text: 'Meter tails pass unsupported through the steel frame of the switch room wall with no grommet; the outer sheath is chafed.',
      location: 'Switch room, goods-in corridor',
      code: 'C2',
      boardReference: null,
      circuitNumber: null,
      inspectionItem: '1.3',
    },
    'o-6': {
      number: 6,
      text: 'Circuit chart at the board is handwritten and out of date: ways 16 to 18 are not listed.',
      location: 'Main board MDB-1',
      code: 'C3',
      boardReference: mdb,
      circuitNumber: null,
      inspectionItem: '4.5',
    },
    'o-7': {
      number: 7,
      text: 'Office socket rings are protected by type AC RCDs; type A would also respond to the pulsating DC of modern office equipment.',
      location: 'Main board MDB-1, ways 2L1 and 2L2',
      code: 'C3',
      boardReference: mdb,
      circuitNumber: '2L1',
      inspectionItem: '4.6',
    },
    'o-8': {
      number: 8,
      text: 'No notice at the board asking users to test the RCDs regularly.',
      location: 'Main board MDB-1',
      code: 'C3',
      boardReference: mdb,
      circuitNumber: null,
      inspectionItem: '4.7',
    },
    'o-9': {
      number: 9,
      text: 'No surge protective device at the origin; one would protect the ovens’ and chillers’ electronic controls from transient overvoltages.',
      location: 'Main board MDB-1',
      code: 'C3',
      boardReference: mdb,
      circuitNumber: null,
      inspectionItem: '4.8',
    },
    'o-10': {
      number: 10,
      text:
        'Proving cabinet: insulation resistance live–earth 0.6 MΩ at 500 V, below the 1.0 MΩ minimum. The cause (heating element, ' +
        'flexible cable or fixed wiring) could not be found on the day: test the appliance and the circuit apart.',
      location: 'Production floor, proving cabinet',
      code: 'FI',
      boardReference: mdb,
      circuitNumber: '5L1',
      inspectionItem: null,
    },
    'o-11': {
      number: 11,
      text: 'A cable of unknown origin enters the board through an open knock-out at the top; where it comes from and what protects it could not be traced.',
      location: 'Main board MDB-1, top left',
      code: 'FI',
      boardReference: mdb,
      circuitNumber: null,
      inspectionItem: null,
    },
    'o-12': {
      number: 12,
      text: 'Scorch marks on the wall above the display oven’s outlet; the outlet could not be opened during trading. Examine the connection.',
      location: 'Shop, behind the display oven',
      code: 'FI',
      boardReference: mdb,
      circuitNumber: '19L3',
      inspectionItem: null,
    },
  },
  summary: {
    generalCondition:
      'Generally in fair order for its age, but two dangers were made safe on the day (C1) and three matters need urgent attention (C2). ' +
      'The installation is not satisfactory for continued use until the C1 and C2 items are put right and the FI items investigated.',
    nextInspectionMonths: 12,
    nextInspectionReason: 'Shorter than usual: heat, flour dust and daily wash-down in the production area, and the number of C1 and C2 items found.',
  },
  declaration: {
    samePersonForAll: false,
    designer: nobody,
    constructor: nobody,
    inspector: person('Callum Brierley', 'Electrician, inspection and testing', '2026-11-25'),
    // The reviewer is named when the report is reviewed.
    reviewer: nobody,
  },
};
