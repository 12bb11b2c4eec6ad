package org.tectomelt.engine.settings;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.DeferredList;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.units.Units;

/** The ridge, hotspot and rift settings built on the decompression column (engine unit tests). */
class DecompressionSettingsTest {

    private static final double C = 273.15;
    private final Katz2003Peridotite katz = Katz2003Peridotite.fertile();

    @Test
    void aRidgeMakesCrustFromAPassiveColumnAndProductionIsCrustTimesFullRate() {
        double rate = Units.mmPerYrToMPerS(60);
        MidOceanRidge.Result r = new MidOceanRidge(katz, 1330 + C, 0.0, rate).solve();
        ColumnResult plain = DecompressionColumn.of(katz, 1330 + C, 0.0).solve();
        assertEquals(Upwelling.PASSIVE, r.column().upwelling());
        assertEquals(0.0, r.column().lidDepth(), 0.0);
        assertEquals(plain.crustalThickness(), r.crustalThickness(), 1e-9);
        assertEquals(r.crustalThickness() * rate, r.meltProduction(), 1e-18);
        // 8.36 km × 60 mm/yr = 5.0e-4 km³/yr per km of ridge
        assertEquals(8.364e3 * 0.060 * 1e-9 * 1e3, Units.m2PerSToKm3PerYrPerKm(r.meltProduction()), 2e-7);
        assertTrue(r.warnings().isEmpty());
        assertTrue(new MidOceanRidge(katz, 1330 + C, 0.0, Units.mmPerYrToMPerS(12)).solve().warnings().stream()
                .anyMatch(w -> w.contains("conductive cooling")));
    }

    @Test
    void theSettingsBuildTheirAssumptionsWhenReadAndStateTheColumnsAndTheirOwn() {
        MidOceanRidge.Result slow = new MidOceanRidge(katz, 1330 + C, 0.0, Units.mmPerYrToMPerS(12)).solve();
        MidOceanRidge.Result fast = new MidOceanRidge(katz, 1330 + C, 0.0, Units.mmPerYrToMPerS(60)).solve();
        Hotspot.Result plume = new Hotspot(katz, 1550 + C, 1350 + C, 70e3, 60e3, Units.cmPerYrToMPerS(8), 0.0).solve();
        ContinentalRift.Result rift = new ContinentalRift(katz, 1350 + C, 4.0, 120e3, 35e3, 0.0).solve();
        for (var text : List.of(slow.assumptions(), fast.assumptions(), plume.assumptions(), rift.assumptions())) {
            assertFalse(((DeferredList<String>) text).isBuilt(), "a setting's text waits until it is read");
        }
        assertEquals(concat(slow.column().assumptions(), "ridge: passive triangular melting region; "
                + SlowSpreadingConductiveLid.standard().describe(Units.mmPerYrToMPerS(12), slow.conductiveLid())
                + "; melt production = crustal thickness × full spreading rate"), slow.assumptions());
        assertEquals(fast.column().assumptions().size() + 1, fast.assumptions().size());
        assertTrue(fast.assumptions().get(fast.assumptions().size() - 1).startsWith(
                "ridge: passive triangular melting region up to the sea floor"));
        assertEquals(plume.column().assumptions(), plume.assumptions().subList(0, plume.assumptions().size() - 1));
        assertTrue(plume.assumptions().get(plume.assumptions().size() - 1).startsWith("hotspot: top-hat plume conduit"));
        assertEquals(rift.column().assumptions(), rift.assumptions().subList(0, rift.assumptions().size() - 1));
        assertTrue(rift.assumptions().get(rift.assumptions().size() - 1).startsWith("rift: instantaneous uniform "
                + "stretching by β = 4.00 (McKenzie 1978)"));
    }

    private static List<String> concat(List<String> first, String last) {
        List<String> all = new java.util.ArrayList<>(first);
        all.add(last);
        return all;
    }

    @Test
    void aColdRidgeMakesNoCrust() {
        MidOceanRidge.Result r = new MidOceanRidge(katz, 1050 + C, 0.0, Units.mmPerYrToMPerS(60)).solve();
        assertEquals(0.0, r.crustalThickness(), 0.0);
        assertEquals(0.0, r.meltProduction(), 0.0);
        assertTrue(r.column().onset().isEmpty());
    }

    @Test
    void aHotspotFluxIsTheTopHatMassBalanceAtTheLid() {
        double radius = 60e3;
        double w = Units.cmPerYrToMPerS(8);
        Hotspot.Result r = new Hotspot(katz, 1550 + C, 1350 + C, 70e3, radius, w, 0.0).solve();
        assertEquals(200.0, r.excessTemperature(), 1e-9);
        assertEquals(Upwelling.ACTIVE, r.column().upwelling());
        assertEquals(70e3, r.column().top().get().depth(), 0.0);
        double f = r.meltFractionAtLid();
        assertEquals(r.column().top().get().meltFraction(), f, 0.0);
        assertEquals(Math.PI * radius * radius * w * f * 3300 / 2900, r.meltFlux(), 1e-9);
        assertEquals(r.column().onset().get().depth(), r.onsetDepth().getAsDouble(), 0.0);
        assertTrue(r.warnings().isEmpty());
    }

    @Test
    void aThickerLidShrinksTheHotspotFluxToZero() {
        double previous = Double.MAX_VALUE;
        for (double lid = 40e3; lid <= 200e3; lid += 20e3) {
            Hotspot.Result r = new Hotspot(katz, 1500 + C, 1350 + C, lid, 50e3, Units.cmPerYrToMPerS(5), 0.0).solve();
            assertTrue(r.meltFlux() < previous || r.meltFlux() == 0);
            previous = r.meltFlux();
        }
        assertEquals(0.0, previous, 0.0);
        Hotspot.Result mild = new Hotspot(katz, 1400 + C, 1350 + C, 60e3, 50e3, 1e-9, 0.0).solve();
        assertTrue(mild.warnings().stream().anyMatch(x -> x.contains("usually")));
    }

    @Test
    void aRiftLidIsTheStretchedLithosphereAndMeltBeginsAtTheOnsetStretchingFactor() {
        ContinentalRift rift = new ContinentalRift(katz, 1330 + C, 4.0, 120e3, 35e3, 0.0);
        ContinentalRift.Result r = rift.solve();
        assertEquals(30e3, r.lidDepth(), 1e-9);
        assertEquals(8.75e3, r.stretchedCrust(), 1e-9);
        double b0 = r.onsetStretchingFactor().getAsDouble();
        assertTrue(b0 > 1 && b0 < 4);
        // at β0 the stretched lid base sits exactly at the onset depth of the stretched column
        assertEquals(120e3 / b0, rift.columnAt(b0).onsetDepth().getAsDouble(), 1.0);
        assertEquals(0.0, new ContinentalRift(katz, 1330 + C, b0 * 0.99, 120e3, 35e3, 0.0).solve().meltThickness(), 0.0);
        assertTrue(new ContinentalRift(katz, 1330 + C, b0 * 1.05, 120e3, 35e3, 0.0).solve().meltThickness() > 0);
        assertEquals(r.meltThickness() * 3300 / 2900, r.igneousCrustThickness(), 1e-9);
        assertEquals(r.column().meltIntegral(), r.meltThickness(), 1e-9, "lithosphere thicker than the onset depth");
    }

    @Test
    void aLithosphereThinnerThanTheOnsetCountsOnlyTheMeltMadeByStretching() {
        ContinentalRift unstretched = new ContinentalRift(katz, 1450 + C, 1.0, 80e3, 30e3, 0.0);
        assertEquals(1.0, unstretched.onsetStretchingFactor().getAsDouble(), 0.0);
        assertEquals(0.0, unstretched.solve().meltThickness(), 1e-6);
        ContinentalRift.Result r = new ContinentalRift(katz, 1450 + C, 2.0, 80e3, 30e3, 0.0).solve();
        ColumnResult toNewLid = r.column();
        ColumnResult toOldLid = new ContinentalRift(katz, 1450 + C, 2.0, 80e3, 30e3, 0.0).columnAt(2.0)
                .withLidDepth(80e3).solve();
        assertEquals(toNewLid.meltIntegral() - toOldLid.meltIntegral(), r.meltThickness(), 1e-6);
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("already thinner")));
    }

    @Test
    void aColdRiftNeverMelts() {
        ContinentalRift.Result r = new ContinentalRift(katz, 1050 + C, 20.0, 120e3, 35e3, 0.0).solve();
        assertTrue(r.onsetStretchingFactor().isEmpty());
        assertEquals(0.0, r.meltThickness(), 0.0);
    }
}
