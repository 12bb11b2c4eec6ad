package org.tectomelt.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.Geotherm;
import org.tectomelt.engine.thermal.HalfSpaceCooling;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.thermal.MantleAdiabat;
import org.tectomelt.engine.thermal.PlateCooling;
import org.tectomelt.engine.thermal.PlateParameters;
import org.tectomelt.engine.units.Units;

/**
 * The thermal lithosphere a geotherm implies and the depth where it meets a solidus:
 * <ul>
 *   <li>half-space cooling: y_L = 2·erfinv(0.9)·√(κt) = 2.326·√(κt), 130.7 km at 100 Myr with κ = 1e-6
 *       (Turcotte &amp; Schubert, Geodynamics, ch. 4; REFERENCES §1.2 [calc]);</li>
 *   <li>plate model: the plate thickness, 95 km for GDH1 (Stein &amp; Stein 1992, Nature 359, 123 [pub]);</li>
 *   <li>a ridge-like geotherm (the adiabat of Tp 1350 °C up to the surface) meets the dry Katz et al. (2003)
 *       solidus at 2.661 GPa, about 82 km (REFERENCES §2.5 [calc]); a cold old plate never does.</li>
 * </ul>
 */
class TurcotteSchubertThermalLithosphereReferenceTest {

    private final MantleAdiabat adiabat = MantleAdiabat.of(Units.celsiusToKelvin(1350));

    @Test
    void halfSpaceThicknessIs2Point32RootKappaT() {
        Geotherm g = Geotherm.conductive(HalfSpaceCooling.of(Units.myrToS(100)));
        // REFERENCES §1.2 [calc]: 130.7 km at 100 Myr (book rounds the factor to 2.32)
        assertEquals(130.7e3, g.thermalLithosphereThickness().getAsDouble(), 0.1e3);
        assertEquals(2.326 * Math.sqrt(1e-6 * Units.myrToS(100)), g.thermalLithosphereThickness().getAsDouble(), 50);
    }

    @Test
    void plateThicknessIsThePlate() {
        Geotherm g = Geotherm.combined(new PlateCooling(PlateParameters.GDH1, Units.myrToS(60)), adiabat);
        // Stein & Stein (1992): a = 95 km
        assertEquals(95e3, g.thermalLithosphereThickness().getAsDouble(), 1e-6);
        Geotherm c = Geotherm.combined(ContinentalGeotherm.of(0.060), adiabat);
        assertEquals(c.lithosphereBaseDepth().getAsDouble(), c.thermalLithosphereThickness().getAsDouble(), 0.0);
        assertTrue(Geotherm.adiabatic(adiabat).thermalLithosphereThickness().isEmpty());
    }

    @Test
    void anAdiabaticGeothermMeetsTheDrySolidusWhereTheColumnStarts() {
        Katz2003Peridotite katz = Katz2003Peridotite.fertile();
        LithostaticColumn col = LithostaticColumn.mantleOnly();
        Geotherm ridge = Geotherm.adiabatic(MantleAdiabat.of(Units.celsiusToKelvin(1350)));
        Geotherm.SolidusInterval at = ridge.solidusInterval(d -> katz.solidus(col.pressureAt(d), 0), 300e3).get();
        assertEquals(0.0, at.topDepth(), 0.0);
        double z = at.baseDepth().getAsDouble();
        // REFERENCES §2.5 [calc]: 2.661 GPa; with the adiabat of this geotherm (MantleAdiabat, αg/cp) a few km apart
        assertEquals(2.661, Units.paToGpa(col.pressureAt(z)), 0.15);
        assertEquals(katz.solidus(col.pressureAt(z), 0), ridge.temperatureAt(z), 0.01);
        // a thick lithosphere over the same mantle: the geotherm reaches the solidus only below its base
        Geotherm lidded = Geotherm.combined(ContinentalGeotherm.of(0.070), MantleAdiabat.of(Units.celsiusToKelvin(1350)));
        Geotherm.SolidusInterval under = lidded.solidusInterval(d -> katz.solidus(col.pressureAt(d), 0), 300e3).get();
        assertTrue(under.topDepth() > 0 && under.topDepth() < z, "top " + under.topDepth());
        assertEquals(z, under.baseDepth().getAsDouble(), 1.0);
        Geotherm old = Geotherm.conductive(new PlateCooling(PlateParameters.GDH1, Units.myrToS(150)));
        assertTrue(old.solidusInterval(d -> katz.solidus(col.pressureAt(d), 0), 90e3).isEmpty());
    }
}
