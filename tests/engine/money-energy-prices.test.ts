/**
 * Energy prices and the cost of a kWh of heat delivered (docs/methods.md#balance-point economic balance point,
 * test vector #17). Heating values: natural gas 1036 Btu/ft³, U.S. EIA "Heat Content of Natural Gas
 * Consumed" (U.S., 2025) [S]; heating oil 138 500 Btu/gal and propane 91 333 Btu/gal, EIA end-use
 * heat contents [M, secondary copies]. Conversions by hand with 1 Btu_IT = 1055.05585262 J,
 * 1 ft³ = 0.028316846592 m³, 1 US gal = 3.785411784 L (exact definitions) [S].
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { equipmentOptionSchema, type EquipmentOption } from '../../shared/equipment/equipment-schemas';
import {
  DEFAULT_HEATING_VALUES,
  energyCostPerKwhDelivered,
  energyPricesSchema,
  KWH_PER_THERM,
  pricePerKwhOfFuel,
  type EnergyPrices,
} from '../../shared/money/energy-prices';
import { assertClose } from './close-to';

const BTU_J = 1055.05585262;
const FT3_M3 = 0.028316846592;
const GAL_L = 3.785411784;

const option = (o: Record<string, unknown>): EquipmentOption =>
  equipmentOptionSchema.parse({ label: 'Option', installedPrice: '1000', lifeYears: 15, ...o });

const furnace95 = option({ kind: 'furnace', fuel: 'gas', efficiency: 0.95, outputW: 20_000 });
const heatPump = option({
  kind: 'heat-pump',
  capacity8_3W: 10_000,
  cop8_3: 3.5,
  capacityM8_3W: 6000,
  copM8_3: 2.3,
  backupW: 5000,
});

const prices = (p: Partial<EnergyPrices>): EnergyPrices =>
  energyPricesSchema.parse({ currency: 'USD', electricityPerKwh: '0.15', ...p });

describe('heating values', () => {
  it('converts the stated fuel heat contents to SI', () => {
    assertClose(DEFAULT_HEATING_VALUES.gasMjPerM3, (1036 * BTU_J) / FT3_M3 / 1e6, 1e-9, 'gas MJ/m³'); // ≈ 38.60
    assertClose(DEFAULT_HEATING_VALUES.oilMjPerL, (138_500 * BTU_J) / GAL_L / 1e6, 1e-9, 'oil MJ/L'); // ≈ 38.60
    assertClose(DEFAULT_HEATING_VALUES.propaneMjPerL, (91_333 * BTU_J) / GAL_L / 1e6, 1e-9, 'propane MJ/L'); // ≈ 25.46
    assertClose(KWH_PER_THERM, 29.3071, 1e-4, 'kWh per therm'); // [C] docs/methods.md#units
  });
});

describe('cost of a kWh delivered', () => {
  it('#17: at 0.15 $/kWh and 1.00 $/therm, a 95 % furnace and a heat pump cost the same at COP 4.176', () => {
    const p = prices({ gas: { unit: 'therm', price: '1.00' } });
    const gasPerKwh = pricePerKwhOfFuel('gas', p);
    assert.ok(gasPerKwh);
    assertClose(gasPerKwh.toNumber(), 0.034121, 1e-6, '$/kWh of gas'); // [C] docs/methods.md#balance-point
    const furnace = energyCostPerKwhDelivered(furnace95, p);
    assert.ok(furnace);
    // COP_econ = price_e·η / price_f = 0.15 × 0.95 / 0.034121 = 4.176 [C] docs/methods.md#check-values.
    assertClose(0.15 / furnace.toNumber(), 4.176, 1e-3, 'COP_econ');
  });

  it('gas per m³ uses the higher heating value; an organisation can state its own', () => {
    const perM3 = prices({ gas: { unit: 'm3', price: '0.40' } });
    const kwhPerM3 = (1036 * BTU_J) / FT3_M3 / 3.6e6; // ≈ 10.72 kWh/m³
    assertClose(energyCostPerKwhDelivered(furnace95, perM3)?.toNumber(), 0.4 / kwhPerM3 / 0.95, 1e-12, 'per m³');
    const own = prices({ gas: { unit: 'm3', price: '0.40' }, heatingValues: { gasMjPerM3: 36 } });
    assertClose(
      energyCostPerKwhDelivered(furnace95, own)?.toNumber(),
      0.4 / 10 / 0.95,
      1e-12,
      'own value: 36 MJ/m³ = 10 kWh/m³',
    );
    const perKwh = prices({ gas: { unit: 'kWh', price: '0.05' } });
    // [C] 0.05 / 0.95 = 1/19, to the 40 significant digits of the money arithmetic.
    assert.equal(
      energyCostPerKwhDelivered(furnace95, perKwh)?.toString(),
      '0.05263157894736842105263157894736842105263',
    );
  });

  it('oil and propane per litre', () => {
    const p = prices({ oilPerLitre: '1.20', propanePerLitre: '0.80' });
    const boiler = option({ kind: 'boiler', fuel: 'oil', efficiency: 0.85, outputW: 25_000 });
    const kwhPerL = (138_500 * BTU_J) / GAL_L / 3.6e6;
    assertClose(energyCostPerKwhDelivered(boiler, p)?.toNumber(), 1.2 / kwhPerL / 0.85, 1e-12, 'oil');
    const lp = option({ kind: 'furnace', fuel: 'propane', efficiency: 0.96, inputW: 20_000 });
    assertClose(
      energyCostPerKwhDelivered(lp, p)?.toNumber(),
      0.8 / ((91_333 * BTU_J) / GAL_L / 3.6e6) / 0.96,
      1e-12,
      'propane',
    );
  });

  it('electric resistance costs the electricity price; a heat pump divides it by its COP at the temperature', () => {
    const p = prices({});
    const heater = option({ kind: 'electric', outputW: 9000 });
    assert.equal(energyCostPerKwhDelivered(heater, p)?.toString(), '0.15');
    // [C] COP(0 °C) = 8000 / 2732.919 = 2.9273 (docs/methods.md#heat-pump-capacity).
    assertClose(energyCostPerKwhDelivered(heatPump, p, 0)?.toNumber(), 0.15 / 2.9273, 1e-5, 'heat pump 0 °C');
    assert.throws(() => energyCostPerKwhDelivered(heatPump, p), /outdoor temperature/);
  });

  it('is null when the organisation has no price for that fuel', () => {
    assert.equal(energyCostPerKwhDelivered(furnace95, prices({})), null);
    assert.equal(pricePerKwhOfFuel('oil', prices({})), null);
  });
});

describe('energy prices schema', () => {
  it('explains a bad currency, price or gas unit', () => {
    const cur = energyPricesSchema.safeParse({ currency: 'usd', electricityPerKwh: '0.15' });
    assert.ok(!cur.success);
    assert.match(cur.error.issues[0]?.message ?? '', /three-letter currency code/);
    const price = energyPricesSchema.safeParse({ currency: 'EUR', electricityPerKwh: '0.1234567' });
    assert.ok(!price.success);
    assert.deepEqual(price.error.issues[0]?.path, ['electricityPerKwh']);
    assert.match(price.error.issues[0]?.message ?? '', /electricity price per kWh/);
    const unit = energyPricesSchema.safeParse({
      currency: 'EUR',
      electricityPerKwh: '0.30',
      gas: { unit: 'gallon', price: '1' },
    });
    assert.ok(!unit.success);
    assert.match(unit.error.issues[0]?.message ?? '', /per m3, per kWh or per therm/);
  });
});
