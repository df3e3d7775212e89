/**
 * Energy prices of an organisation and the cost of a kWh of heat delivered by an equipment option.
 * Prices are decimal strings in the organisation's currency; costs are computed with decimal.js.
 * Fuel heat contents are higher (gross) heating values, stated below with their sources.
 */
import type { Decimal } from 'decimal.js';
import { z } from 'zod';
import { convertUnits } from '../units/units';
import { capacityAt } from '../equipment/capacity';
import type { EquipmentOption } from '../equipment/equipment-schemas';
import { currencyCodeSchema, divideMoney, parseMoney, UNIT_PRICE_PATTERN } from './money';

/**
 * Natural gas, 1036 Btu per standard cubic foot: U.S. average heat content of natural gas consumed,
 * 2025 (1036–1037 in 2020–2025) — U.S. EIA data series "Heat Content of Natural Gas Consumed"
 * [S]; EIA uses gross (higher) heating values [S: EIA definitions for that series]. Gas
 * composition varies by region and supplier: organisations can enter their utility's value.
 */
export const GAS_HHV_BTU_PER_FT3 = 1036;
/** No. 2 heating oil, 138 500 Btu/US gallon (EIA end-use heat content) [M: secondary copies of the EIA table]. */
export const OIL_HHV_BTU_PER_GAL = 138_500;
/** Propane, 91 333 Btu/US gallon (EIA end-use heat content) [M: secondary copies of the EIA table]. */
export const PROPANE_HHV_BTU_PER_GAL = 91_333;

/** Default heating values in SI: gas MJ/m³, oil and propane MJ/L (converted through mathjs units [C]). */
export const DEFAULT_HEATING_VALUES = {
  gasMjPerM3: convertUnits(GAS_HHV_BTU_PER_FT3, 'BTU/ft^3', 'MJ/m^3'),
  oilMjPerL: convertUnits(OIL_HHV_BTU_PER_GAL, 'BTU/gal', 'MJ/L'),
  propaneMjPerL: convertUnits(PROPANE_HHV_BTU_PER_GAL, 'BTU/gal', 'MJ/L'),
} as const;

/** 1 therm = 100 000 Btu = 29.3071 kWh (docs/methods.md#units [C]). */
export const KWH_PER_THERM = convertUnits(100_000, 'BTU', 'kWh');

const MJ_PER_KWH = 3.6;

const unitPrice = (label: string) =>
  z
    .string({ error: `Enter the ${label} as text such as 0.1523` })
    .trim()
    .regex(UNIT_PRICE_PATTERN, `Enter the ${label} such as 0.1523 (digits, a decimal point and at most 6 decimals)`);

const heatingValue = (label: string, unit: string, min: number, max: number) =>
  z
    .number({ error: `Enter the ${label} as a number (${unit})` })
    .min(min, `The ${label} must be at least ${min} ${unit}`)
    .max(max, `The ${label} must be at most ${max} ${unit}`);

export const gasPriceUnits = ['m3', 'kWh', 'therm'] as const;
export type GasPriceUnit = (typeof gasPriceUnits)[number];

export const energyPricesSchema = z.strictObject({
  currency: currencyCodeSchema,
  /** Electricity, per kWh. */
  electricityPerKwh: unitPrice('electricity price per kWh'),
  /** Natural gas, per m³, per kWh (of higher heating value) or per therm. */
  gas: z
    .strictObject({
      unit: z.enum(gasPriceUnits, { error: 'Gas is priced per m3, per kWh or per therm' }),
      price: unitPrice('gas price'),
    })
    .optional(),
  /** Heating oil, per litre. */
  oilPerLitre: unitPrice('oil price per litre').optional(),
  /** Propane, per litre. */
  propanePerLitre: unitPrice('propane price per litre').optional(),
  /** Heating values that replace the defaults (a utility's declared gas value, for example). */
  heatingValues: z
    .strictObject({
      gasMjPerM3: heatingValue('gas heating value', 'MJ/m³', 20, 60).optional(),
      oilMjPerL: heatingValue('oil heating value', 'MJ/L', 30, 45).optional(),
      propaneMjPerL: heatingValue('propane heating value', 'MJ/L', 20, 30).optional(),
    })
    .optional(),
});
export type EnergyPrices = z.infer<typeof energyPricesSchema>;

/**
 * Price of one kWh of the fuel's energy (higher heating value), in the prices' currency; null when
 * the organisation has no price for that fuel.
 */
export function pricePerKwhOfFuel(fuel: EquipmentOption['fuel'], prices: EnergyPrices): Decimal | null {
  const hv = { ...DEFAULT_HEATING_VALUES, ...prices.heatingValues };
  switch (fuel) {
    case 'electricity':
      return parseMoney(prices.electricityPerKwh);
    case 'gas': {
      if (!prices.gas) return null;
      const price = parseMoney(prices.gas.price);
      if (prices.gas.unit === 'kWh') return price;
      if (prices.gas.unit === 'therm') return divideMoney(price, KWH_PER_THERM);
      return divideMoney(price, hv.gasMjPerM3 / MJ_PER_KWH);
    }
    case 'oil':
      return prices.oilPerLitre === undefined ? null : divideMoney(prices.oilPerLitre, hv.oilMjPerL / MJ_PER_KWH);
    case 'propane':
      return prices.propanePerLitre === undefined
        ? null
        : divideMoney(prices.propanePerLitre, hv.propaneMjPerL / MJ_PER_KWH);
  }
}

/**
 * Cost of one kWh of heat delivered by an option (not rounded): the fuel's price per kWh divided by
 * the efficiency (furnace, boiler; 1 for electric resistance) or, for a heat pump, by its COP at
 * `outdoorC` (the backup's COP 1 when the compressor is off). Null when the fuel has no price.
 */
export function energyCostPerKwhDelivered(
  option: EquipmentOption,
  prices: EnergyPrices,
  outdoorC?: number,
): Decimal | null {
  const perKwh = pricePerKwhOfFuel(option.fuel, prices);
  if (perKwh === null) return null;
  if (option.kind !== 'heat-pump') return divideMoney(perKwh, option.efficiency);
  if (outdoorC === undefined) throw new Error("A heat pump's cost per kWh depends on the outdoor temperature");
  const cop = capacityAt(option, outdoorC).cop;
  return divideMoney(perKwh, cop > 0 ? cop : 1);
}
