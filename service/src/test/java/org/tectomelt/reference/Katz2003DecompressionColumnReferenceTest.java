package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.MeltingColumn;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.melting.Katz2003Peridotite;

/**
 * The isentropic column with the Katz, Spiegelman &amp; Langmuir (2003) parameterization, dry,
 * Tp = 1350 °C, no lid, against the worked values of REFERENCES.md §2.5, which were computed there
 * independently with a separate numpy/scipy script from the same equations and the Table 2
 * constants of REFERENCES §2.1 [calc]. Tolerances follow the printed precision of those values.
 */
class Katz2003DecompressionColumnReferenceTest {

    private static final double C = 273.15;
    private final ColumnResult column = DecompressionColumn.of(Katz2003Peridotite.fertile(), 1350 + C, 0.0)
            .withOutputStep(500).solve();

    @Test
    void meltingBeginsAt2661GpaNear82KmAnd1403C() {
        // REFERENCES §2.5 [calc]: 2.661 GPa (printed to 1 MPa), ≈ 82 km, 1403 °C (printed to 1 K)
        assertEquals(2.661e9, column.onset().get().pressure(), 0.5e6 + 1e3);
        assertEquals(82e3, column.onset().get().depth(), 0.5e3);
        assertEquals(1403 + C, column.onset().get().temperature(), 0.5);
    }

    @Test
    void theMeltFractionAtTheSurfaceIs0236() {
        // REFERENCES §2.5 [calc]: F at 0 GPa = 0.236 (printed to 0.001)
        assertEquals(0.0, column.top().get().pressure(), 0.0);
        assertEquals(0.236, column.top().get().meltFraction(), 0.0005);
        assertEquals(0.236, column.maxMeltFraction(), 0.0005);
    }

    @Test
    void theMeltThicknessIs885Km() {
        // REFERENCES §2.5 [calc]: ∫F dz = 8.85 km with ρ = 3300 kg/m³ (printed to 10 m)
        assertEquals(8.85e3, column.meltIntegral(), 5.0);
        assertEquals(8.85e3, column.meltThickness(), 5.0);
    }

    @Test
    void productivityRisesFromZeroAtTheSolidusToAbout10PercentPerGpaNearTheSurface() {
        // REFERENCES §2.5 [calc]: productivity rises from 0 at the solidus to ≈ 10 %/GPa near the surface
        List<ProfilePoint> p = column.profile();
        assertEquals(0.0, p.get(0).productivity(), 1e-15);
        double top = p.get(p.size() - 1).productivity() * 1e11; // %/GPa
        assertEquals(10.0, top, 0.5);
        for (int i = 1; i < p.size(); i++) {
            assertTrue(p.get(i).productivity() > p.get(i - 1).productivity(), "rising at " + p.get(i).depth());
        }
    }

    @Test
    void theTemperaturePathFollowsTheLawAndEndsCoolerThanTheAdiabat() {
        // Katz et al. (2003): latent heat consumed by melting cools the rock below the melt-free adiabat
        MeltingColumn c = column.column();
        for (ProfilePoint q : column.profile()) {
            assertEquals(q.meltFraction(), Katz2003Peridotite.fertile().meltFraction(q.pressure(), q.temperature(), 0),
                    1e-9);
            assertTrue(q.temperature() <= c.adiabatTemperature(q.pressure()) + 1e-9);
        }
    }
}
