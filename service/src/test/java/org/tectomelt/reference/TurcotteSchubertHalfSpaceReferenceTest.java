package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.apache.commons.math3.special.Erf;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.thermal.HalfSpaceCooling;
import org.tectomelt.engine.units.Units;

/**
 * Half-space cooling of the oceanic lithosphere against Turcotte &amp; Schubert (2014,
 * <i>Geodynamics</i>, 3rd ed., chapter 4) with their usual parameters k = 3.3 W/m/K,
 * κ = 1e-6 m²/s, Tm − T0 = 1300 K (from memory, REFERENCES §1.2 [mem]).
 *
 * <p>Check values are REFERENCES §1.2, computed there independently with numpy/scipy [calc];
 * the erf values are from Abramowitz &amp; Stegun (1964) Table 7.1 (from memory).
 */
class TurcotteSchubertHalfSpaceReferenceTest {

    private final HalfSpaceCooling at100 = HalfSpaceCooling.of(Units.myrToS(100));

    @Test
    void heatFlowAt100MyrIs43Point1MilliwattsPerSquareMetre() {
        // REFERENCES §1.2 [calc]: q0 = k ΔT / √(πκt) = 43.1 mW/m²; tolerance is the printed 0.05
        assertEquals(43.1, Units.wPerM2ToMwPerM2(at100.surfaceHeatFlow()), 0.05);
    }

    @Test
    void heatFlowFollows431OverRootAge() {
        // REFERENCES §1.2 [calc]: q0 = 431 / √t(Myr) mW/m² with these parameters; printed to 3 figures
        for (double myr : new double[] {1, 4, 25, 64, 144}) {
            double q = Units.wPerM2ToMwPerM2(HalfSpaceCooling.of(Units.myrToS(myr)).surfaceHeatFlow());
            assertEquals(431 / Math.sqrt(myr), q, 0.5 / Math.sqrt(myr), myr + " Myr");
        }
    }

    @Test
    void thermalThicknessIs2Point326RootKappaTAnd130Point7KmAt100Myr() {
        double rootKappaT = Math.sqrt(1e-6 * Units.myrToS(100));
        // Turcotte & Schubert: yL = 2 erfinv(0.9) √(κt), which the book rounds to 2.32 √(κt)
        assertEquals(2.32, at100.thermalThickness() / rootKappaT, 0.01);
        // REFERENCES §1.2 [calc]: 2.326 √(κt) = 130.7 km at 100 Myr; printed to 0.1 km
        assertEquals(130.7e3, at100.thermalThickness(), 50);
    }

    @Test
    void temperatureAt50KmAfter100MyrIs612C() {
        // REFERENCES §1.2 [calc]: T(50 km) = 1300 erf(50 km / 2√(κt)) = 612 °C; printed to 1 °C
        assertEquals(612, Units.kelvinToCelsius(at100.temperatureAt(50e3)), 0.5);
    }

    @Test
    void erfTemperaturesMatchTabulatedErf() {
        // Abramowitz & Stegun (1964) Table 7.1 (from memory): erf(0.5) = 0.5204998778,
        // erf(1) = 0.8427007929, erf(2) = 0.9953222650; 10 printed digits
        double twoRootKappaT = 2 * Math.sqrt(1e-6 * Units.myrToS(100));
        double[][] table = {{0.5, 0.5204998778}, {1.0, 0.8427007929}, {2.0, 0.9953222650}};
        for (double[] row : table) {
            double t = Units.kelvinToCelsius(at100.temperatureAt(row[0] * twoRootKappaT));
            assertEquals(1300 * row[1], t, 1300 * 1e-9, "erf(" + row[0] + ")");
            assertEquals(row[1], Erf.erf(row[0]), 1e-9);
        }
    }

    @Test
    void subsidenceIsCloseToTheParsonsSclaterSquareRootFit() {
        // Parsons & Sclater (1977) fit d = 2500 + 350 √t m (0–70 Ma) [pub]; with T&S's usual
        // values (α = 3e-5, ρm = 3300, κ = 1e-6) the half-space gives 355 √t: within 2 %.
        for (double myr : new double[] {4, 16, 36, 64}) {
            double d = HalfSpaceCooling.of(Units.myrToS(myr)).seafloorDepth();
            double fit = 2500 + 350 * Math.sqrt(myr);
            assertEquals(fit, d, 0.02 * (fit - 2500), myr + " Myr");
        }
    }
}
