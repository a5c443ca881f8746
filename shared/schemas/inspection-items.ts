/**
 * The schedule of inspections: what is looked at, grouped by area, in Boardwalk's own words.
 * The areas follow the order in which an installation is usually inspected, from the intake
 * outwards (BS 7671 Part 6 asks for an inspection of each; the wording here is ours).
 * Ids are stable: they are stored with each outcome, so never renumber an item; add new ones.
 */
export interface InspectionArea {
  id: string;
  title: string;
  items: readonly InspectionItem[];
}
export interface InspectionItem {
  /** Stable id, e.g. `1.2`. */
  id: string;
  text: string;
}

export const inspectionAreas: readonly InspectionArea[] = [
  {
    id: '1',
    title: 'Intake and the supplier’s equipment',
    items: [
      { id: '1.1', text: 'Service cable, cut-out and meter tails: condition seen from outside' },
      { id: '1.2', text: 'Supplier’s earthing terminal present and in sound condition' },
      { id: '1.3', text: 'Meter tails: size, support and protection against damage' },
      { id: '1.4', text: 'Isolator between meter and board (where fitted): condition and labelling' },
    ],
  },
  {
    id: '2',
    title: 'Other sources of supply',
    items: [
      { id: '2.1', text: 'Generators, solar PV or batteries: present, and their means of isolation' },
      { id: '2.2', text: 'Warning notices where the installation has more than one source' },
    ],
  },
  {
    id: '3',
    title: 'Earthing and protective bonding',
    items: [
      { id: '3.1', text: 'Earthing conductor: size, connection at both ends, label at the connection' },
      { id: '3.2', text: 'Earth electrode (TT): condition, connection and protection against corrosion' },
      { id: '3.3', text: 'Main protective bonding to water, gas and other incoming services' },
      { id: '3.4', text: 'Main protective bonding conductors: size, continuity and accessible clamps' },
      { id: '3.5', text: 'Supplementary bonding where it is still required' },
    ],
  },
  {
    id: '4',
    title: 'Consumer units and distribution boards',
    items: [
      { id: '4.1', text: 'Enclosure: fixed, undamaged, no openings that let a finger in' },
      { id: '4.2', text: 'Enclosure of non-combustible material, or inside one (dwellings)' },
      { id: '4.3', text: 'Main switch or isolator: works, and is labelled' },
      { id: '4.4', text: 'Protective devices: right type and rating for each circuit, no signs of overheating' },
      { id: '4.5', text: 'Circuits identified: chart or schedule present and correct' },
      { id: '4.6', text: 'RCD provision for sockets, cables in walls and other circuits that need it' },
      { id: '4.7', text: 'Test-button reminder notice for RCDs, and other required notices' },
      { id: '4.8', text: 'Surge protection (SPD): present where required, status indicator healthy' },
      { id: '4.9', text: 'Arc fault detection (AFDD) where fitted or recommended' },
      { id: '4.10', text: 'Conductors: connections tight, no exposed copper, sheaths taken into the enclosure' },
    ],
  },
  {
    id: '5',
    title: 'Final circuits',
    items: [
      { id: '5.1', text: 'Cables: type and size suit the load and the protective device' },
      { id: '5.2', text: 'Cables supported, and protected against damage where exposed' },
      { id: '5.3', text: 'Cables concealed in walls: in safe zones, or protected by an RCD or earthed covering' },
      { id: '5.4', text: 'Accessories: undamaged, securely fixed, correct polarity' },
      { id: '5.5', text: 'Circuit protective conductors present at every point and accessory' },
      { id: '5.6', text: 'Fire barriers and sealing where cables pass through fire-resisting walls or floors' },
      { id: '5.7', text: 'Single-pole switching in the line conductor only' },
      { id: '5.8', text: 'Socket-outlets and outdoor equipment have additional protection by RCD' },
    ],
  },
  {
    id: '6',
    title: 'Rooms with a bath or shower',
    items: [
      { id: '6.1', text: 'Additional protection by RCD of 30 mA for every circuit in the room' },
      { id: '6.2', text: 'Equipment in each zone suitable for that zone (IP rating)' },
      { id: '6.3', text: 'Socket-outlets only where permitted, clear of the zones' },
      { id: '6.4', text: 'Supplementary bonding, or the conditions that allow it to be left out' },
    ],
  },
  {
    id: '7',
    title: 'Other special locations and installations',
    items: [
      { id: '7.1', text: 'Swimming pools, saunas, outdoor or agricultural locations: their particular requirements' },
      { id: '7.2', text: 'Electric vehicle charging points: protection and earthing' },
      { id: '7.3', text: 'Other special installations named in the remarks' },
    ],
  },
];

export const inspectionItemIds: readonly string[] = inspectionAreas.flatMap((area) => area.items.map((item) => item.id));
export const inspectionItemsById: ReadonlyMap<string, InspectionItem> = new Map(
  inspectionAreas.flatMap((area) => area.items.map((item) => [item.id, item] as const)),
);
