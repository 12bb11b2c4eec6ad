package org.tectomelt.engine.crust;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.thermal.ContinentalGeotherm;

class GeothermInitialStateTest {

    private static final double KYR = 3.15576e10;
    private static final double C0 = 273.15;
    private static final Rock BASALT = new Rock(2900, 1100, 400_000, ConductivityLaw.constant(2.5),
            MeltingIntervals.linear(C0 + 1000, C0 + 1200));

    private static SillResult run(ConductivityLaw crustLaw, double duration) {
        Rock crust = new Rock(2750, 1050, 280_000, crustLaw, MeltingIntervals.linear(C0 + 850, C0 + 1100));
        ContinentalGeotherm g = ContinentalGeotherm.of(0.060, 0.6, 10e3, crustLaw.at(C0), C0, 50e3,
                ContinentalGeotherm.HeatProduction.EXPONENTIAL);
        return SillModel.run(new SillModel.Setup(crust, BASALT, new GeothermInitialState(g),
                SillModel.Intrusions.single(100, 40e3, C0 + 1230), 50e3, 25, duration, duration,
                List.of(0.0, duration), 25, SillModel.Numerics.DEFAULT));
    }

    @Test
    void theColumnStartsOnTheClosedFormGeothermAndStaysThereAwayFromTheSill() {
        SillResult r = run(ConductivityLaw.constant(2.5), 200 * KYR);
        ContinentalGeotherm g = ContinentalGeotherm.of(0.060);
        SillResult.Profile start = r.profiles().get(0);
        SillResult.Profile end = r.profiles().get(1);
        for (int i = 0; i < start.depth().length; i++) {
            double z = start.depth()[i];
            if (z < 39e3) {
                // the grid's steady state is the closed form to a small fraction of a kelvin
                assertEquals(g.temperatureAt(z), start.temperature()[i], 0.05, "at " + z + " m");
            }
            if (z < 20e3) {
                // 20 km above the sill after 200 kyr (√(κt) ≈ 2.5 km): no drift; what remains is the tiny
                // far-field response of the implicit scheme's large steps, far below a millikelvin
                assertEquals(start.temperature()[i], end.temperature()[i], 1e-3, "at " + z + " m");
            }
        }
        assertTrue(r.warnings().stream().noneMatch(w -> w.contains("steady geotherm")), r.warnings().toString());
        assertTrue(r.summary().energyErrorFraction() < 1e-9);
    }

    @Test
    void withATemperatureDependentConductivityTheStartIsTheSteadyStateUnderThatLaw() {
        SillResult r = run(Miao2014Conductivity.GRANITE, 50 * KYR);
        assertTrue(r.warnings().stream().anyMatch(w -> w.contains("steady geotherm under")), r.warnings().toString());
        SillResult.Profile start = r.profiles().get(0);
        SillResult.Profile end = r.profiles().get(1);
        for (int i = 0; i < start.depth().length; i++) {
            if (start.depth()[i] < 20e3) {
                assertEquals(start.temperature()[i], end.temperature()[i], 1e-3, "at " + start.depth()[i] + " m");
            }
        }
        // conductivity falls with temperature, so the same heat flows need a hotter deep crust
        ContinentalGeotherm closedForm = ContinentalGeotherm.of(0.060, 0.6, 10e3, Miao2014Conductivity.GRANITE.at(C0),
                C0, 50e3, ContinentalGeotherm.HeatProduction.EXPONENTIAL);
        int i = 30e3 > start.depth()[start.depth().length - 1] ? 0 : (int) (30e3 / 25);
        assertTrue(start.temperature()[i] > closedForm.temperatureAt(start.depth()[i]) + 50);
    }
}
