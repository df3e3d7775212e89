/** The trade's cautions shown beside any sizing result that can leave hours short (screen, report, PDF). */
export const SIZING_CAUTIONS_TITLE = 'Before you size below the coldest point';

export const SIZING_CAUTIONS: readonly string[] = [
  'Unmet hours come from the past record; a colder spell than any in it can happen. A unit sized below the coldest design point will fall behind in such a spell, and the house will cool.',
  'Where pipes could freeze (exterior walls, crawlspaces, unheated rooms, a vacant house) or occupants are vulnerable (infants, elderly or ill people), size for the colder design temperature or keep reliable backup or supplementary heat.',
  'A heat pump relies on its backup heat in the coldest hours and when it defrosts or fails: keep the backup or emergency heat working, on a correctly sized circuit installed by a licensed electrician, and have the installer check the low-temperature lockout settings.',
  'Combustion equipment must be installed, vented and supplied with combustion air by qualified people; fit carbon monoxide alarms. Never use ovens, grills or unvented heaters for space heating in a cold snap.',
  "These are whole-building estimates for comparing options, not a room-by-room load calculation. Local codes, the manufacturer's data and a licensed professional govern the final design.",
];
