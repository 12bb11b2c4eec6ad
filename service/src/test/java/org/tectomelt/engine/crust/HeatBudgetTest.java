package org.tectomelt.engine.crust;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.melting.MeltCurve;

class HeatBudgetTest {

    private static final MeltCurve PELITE = new MeltCurve(new double[] {1023.15, 1073.15, 1123.15, 1173.15},
            new double[] {0, 0.05, 0.25, 0.45});
    private static final HeatBudget BUDGET = new HeatBudget(
            new HeatBudget.Layer(2900, 1100, 400_000, 1503.15, MeltingIntervals.linear(1273.15, 1473.15)),
            new HeatBudget.Layer(2750, 1050, 280_000, 723.15, PELITE));

    @Test
    void theThicknessesFollowFromTheHeatsPerCubicMetre() {
        HeatBudget.Result r = BUDGET.atFinalTemperature(1123.15, null, null);
        assertEquals(r.heatRequired() / r.heatReleased(), r.thicknessRatio(), 1e-15);
        assertEquals(100 * r.heatReleased() / r.heatRequired(), r.crustThicknessFor(100), 1e-9);
        assertEquals(100 * r.thicknessRatio(), r.intrusionThicknessFor(100), 1e-9);
        // a layer brought to the target by an intrusion needs that intrusion back: the two are inverse
        assertEquals(250, r.intrusionThicknessFor(r.crustThicknessFor(250)), 1e-9);
    }

    @Test
    void theCrustsMeltFractionComesFromItsCurveUnlessGiven() {
        assertEquals(0.25, BUDGET.atFinalTemperature(1123.15, null, null).crustMeltFraction(), 1e-12);
        HeatBudget.Result given = BUDGET.atFinalTemperature(1123.15, 0.4, null);
        assertEquals(0.4, given.crustMeltFraction(), 0);
        assertFalse(given.warnings().isEmpty(), "a fraction off the curve is flagged");
    }

    @Test
    void aTargetMeltFractionFindsItsTemperatureOnTheCurve() {
        HeatBudget.Result r = BUDGET.atCrustMeltFraction(0.15, null);
        assertEquals(1098.15, r.finalTemperature(), 1e-9);
        assertEquals(PELITE.solidus(), BUDGET.atCrustMeltFraction(0, null).finalTemperature(), 0);
    }

    @Test
    void theIntrusionCrystallisesWhatItsOwnCurveSaysByDefault() {
        // final temperature inside the basalt's interval: half of it is still molten
        HeatBudget.Result r = BUDGET.atFinalTemperature(1373.15, 0.3, null);
        assertEquals(0.5, r.crystallizedFraction(), 1e-12);
        HeatBudget.Result forced = BUDGET.atFinalTemperature(1373.15, 0.3, 1.0);
        assertTrue(forced.warnings().stream().anyMatch(w -> w.contains("overstates")));
        assertTrue(forced.heatReleased() > r.heatReleased());
    }

    @Test
    void impossibleTargetsAreRefused() {
        assertThrows(EngineException.class, () -> BUDGET.atFinalTemperature(700, null, null));
        assertThrows(EngineException.class, () -> BUDGET.atFinalTemperature(1600, null, null));
        assertThrows(EngineException.class, () -> BUDGET.atCrustMeltFraction(0.6, null));
        HeatBudget noCurve = new HeatBudget(BUDGET.intrusion(),
                new HeatBudget.Layer(2750, 1050, 280_000, 723.15, null));
        assertThrows(EngineException.class, () -> noCurve.atFinalTemperature(1100, null, null));
        assertThrows(EngineException.class, () -> noCurve.atCrustMeltFraction(0.1, null));
    }
}
