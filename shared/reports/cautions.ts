/** The trade's cautions beside any sizing result that can leave hours short, for the designer's screens. */
export const SIZING_CAUTIONS_TITLE = 'Before you size for a milder design temperature';

export const SIZING_CAUTIONS: readonly string[] = [
  'Unmet hours come from the past record; a colder spell than any in it can happen. A unit sized for a milder design temperature than the coldest will fall behind in such a spell, and the house will cool.',
  'Where pipes could freeze (exterior walls, crawlspaces, unheated rooms, a vacant house) or occupants are vulnerable (infants, elderly or ill people), size for the colder design temperature or keep reliable backup or supplementary heat.',
  'A heat pump relies on its backup heat in the coldest hours and when it defrosts or fails: keep the backup or emergency heat working, on a correctly sized circuit installed by a licensed electrician, and have the installer check the low-temperature lockout settings.',
  'Combustion equipment must be installed, vented and supplied with combustion air by qualified people; fit carbon monoxide alarms. Never use ovens, grills or unvented heaters for space heating in a cold snap.',
  "These are whole-building estimates for comparing options, not a room-by-room load calculation. Local codes, the manufacturer's data and a licensed professional govern the final design.",
];

/** The same cautions in plain words, for the homeowner's report, its PDF and the e-mail. */
export const HOMEOWNER_CAUTIONS_TITLE = 'Please read: staying safe and warm';

export const HOMEOWNER_CAUTIONS: readonly string[] = [
  'These figures come from past weather. A colder spell than any on record can happen, and a smaller unit would then let the house cool further.',
  'If anyone in the home is very young, elderly or unwell, or if pipes could freeze (pipes in outside walls or a crawlspace, a house left empty in winter), choose the larger option or keep a safe second source of heat.',
  'Gas, oil and propane equipment must be installed and vented by a qualified installer. Fit carbon monoxide alarms, and never heat the house with an oven, a grill or an unvented heater.',
  'This report compares options to help you decide; it is not a full design. A licensed heating professional confirms the final size with a room-by-room calculation, following local building codes and the manufacturer’s instructions.',
];
