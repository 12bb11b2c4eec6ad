package org.tectomelt.engine.composition;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.Test;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;

/**
 * The increment-by-increment integration: with a fixed mineralogy it must reproduce the closed forms
 * of Shaw (1970) and Zou (1998) (exact identities), conserve mass along real columns to 1e-10, and
 * follow the mineralogy (cpx exhaustion where the melting law says, spinel → garnet).
 */
class ColumnCompositionTest {

    private static final double C = 273.15;
    private static final List<Element> ALL = Element.all();
    private static final double[] MODE = {0.57, 0.28, 0.13, 0.0, 0.02};
    /** A non-modal reaction under which no mineral runs out below F = 0.28. */
    private static final double[] REACTION = {0.20, 0.30, 0.45, 0.0, 0.05};

    private static MantleMineralogy fixed(double[] reaction) {
        return new MantleMineralogy(MODE, MODE, reaction, reaction, new double[] {0.25, 0.75, 0, 0, 0},
                MantleMineralogy.GARNET_IN_PRESSURE_PA, MantleMineralogy.SPINEL_OUT_PRESSURE_PA, List.of());
    }

    private static ColumnComposition model(MantleMineralogy min, MeltingMode mode, double phi) {
        return new ColumnComposition(ALL, CompositionTables.defaultSource(),
                CompositionTables.defaultPartitionCoefficients(), min, mode, phi);
    }

    /** A synthetic path from 95 km to the surface with uneven melt increments, F up to 0.25. */
    private static CompositionResult synthetic(ColumnComposition m) {
        return path(m, 60, s -> 0.25 * s * s * (1.5 - 0.5 * s));
    }

    /** n points from 95 km to the surface, F a function of the height fraction s (0 at 95 km, 1 at the top). */
    private static CompositionResult path(ColumnComposition m, int n, DoubleUnaryOperator meltFraction) {
        double[] z = new double[n];
        double[] p = new double[n];
        double[] f = new double[n];
        for (int i = 0; i < n; i++) {
            double s = i / (double) (n - 1);
            z[i] = 95e3 * (1 - s);
            p[i] = 3300 * 9.81 * z[i];
            f[i] = meltFraction.applyAsDouble(s);
        }
        return m.along(z, p, f, null);
    }

    private static double d0(Element e) {
        return sum(MODE, e);
    }

    private static double sum(double[] x, Element e) {
        double[] k = CompositionTables.defaultPartitionCoefficients().coefficients(e);
        double s = 0;
        for (int j = 0; j < k.length; j++) {
            s += x[j] * k[j];
        }
        return s;
    }

    @Test
    void modalFractionalMeltingAlongAPathIsShawsClosedForm() {
        CompositionResult r = synthetic(model(fixed(MODE), MeltingMode.FRACTIONAL, 0));
        for (Element e : ALL) {
            int j = r.indexOf(e);
            double c0 = CompositionTables.defaultSource().ppm(e);
            double d = d0(e);
            for (int i = 1; i < r.size(); i++) {
                double f = r.meltFraction(i);
                assertEquals(Shaw1970.fractionalMelt(d, f), r.instantaneousMelt(i, j) / c0,
                        1e-11 * Shaw1970.fractionalMelt(d, f) + 1e-300, e + " at F=" + f);
                assertEquals(Shaw1970.accumulatedFractionalMelt(d, f), r.accumulatedMelt(i, j) / c0,
                        1e-11 * Shaw1970.accumulatedFractionalMelt(d, f), e + " at F=" + f);
                assertEquals(Shaw1970.fractionalResidue(d, f), r.residue(i, j) / c0,
                        1e-11 * Shaw1970.fractionalResidue(d, f) + 1e-300, e + " at F=" + f);
            }
        }
    }

    @Test
    void theFirstDropsOfAFractionalMeltKeepTheirDigits() {
        // F from 5e-8 to 1e-3: the accumulated melt at the first steps is the share of the element extracted over
        // F, and where only a small share ~F/D has left, Q_a − Q_b keeps only the digits of that share; the share
        // leaving is taken by e^y − 1, and holds Shaw's (1970) closed form to 1e-13
        for (double[] reaction : List.of(MODE, REACTION)) {
            CompositionResult r = path(model(fixed(reaction), MeltingMode.FRACTIONAL, 0), 40,
                    s -> 1e-3 * s * s * (0.05 + 0.95 * s));
            for (Element e : ALL) {
                int j = r.indexOf(e);
                double c0 = CompositionTables.defaultSource().ppm(e);
                double d = d0(e);
                double pe = sum(reaction, e);
                for (int i = 1; i < r.size(); i++) {
                    double fi = r.meltFraction(i);
                    double acc = Shaw1970.accumulatedFractionalMelt(d, pe, fi);
                    assertEquals(acc, r.accumulatedMelt(i, j) / c0, 1e-13 * acc, e + " at F=" + fi);
                }
            }
        }
    }

    @Test
    void nonModalFractionalAndBatchMeltingAlongAPathAreShawsNonModalForms() {
        CompositionResult fr = synthetic(model(fixed(REACTION), MeltingMode.FRACTIONAL, 0));
        CompositionResult ba = synthetic(model(fixed(REACTION), MeltingMode.BATCH, 0));
        for (Element e : ALL) {
            int j = fr.indexOf(e);
            double c0 = CompositionTables.defaultSource().ppm(e);
            double d = d0(e);
            double p = sum(REACTION, e);
            for (int i = 0; i < fr.size(); i++) {
                double f = fr.meltFraction(i);
                assertEquals(Shaw1970.fractionalMelt(d, p, f), fr.instantaneousMelt(i, j) / c0,
                        1e-11 * Shaw1970.fractionalMelt(d, p, f) + 1e-300, e + " at F=" + f);
                assertEquals(Shaw1970.accumulatedFractionalMelt(d, p, f), fr.accumulatedMelt(i, j) / c0,
                        1e-11 * Shaw1970.accumulatedFractionalMelt(d, p, f), e + " at F=" + f);
                assertEquals(Shaw1970.batchMelt(d, p, f), ba.instantaneousMelt(i, j) / c0,
                        1e-12 * Shaw1970.batchMelt(d, p, f), e + " at F=" + f);
                assertEquals(Shaw1970.batchMelt(d, p, f), ba.accumulatedMelt(i, j) / c0,
                        1e-12 * Shaw1970.batchMelt(d, p, f), e + " at F=" + f);
                assertEquals(Shaw1970.batchResidue(d, p, f), ba.residue(i, j) / c0,
                        1e-12 * Shaw1970.batchResidue(d, p, f), e + " at F=" + f);
            }
        }
    }

    @Test
    void nearFractionalMeltingAlongAPathIsZousDynamicMelting() {
        double phi = 0.02;
        CompositionResult r = synthetic(model(fixed(REACTION), MeltingMode.NEAR_FRACTIONAL, phi));
        for (Element e : ALL) {
            int j = r.indexOf(e);
            double c0 = CompositionTables.defaultSource().ppm(e);
            double d = d0(e);
            double p = sum(REACTION, e);
            for (int i = 0; i < r.size(); i++) {
                double f = r.meltFraction(i);
                if (f < phi) {
                    assertEquals(Shaw1970.batchMelt(d, p, f), r.instantaneousMelt(i, j) / c0,
                            1e-12 * Shaw1970.batchMelt(d, p, f));
                    continue;
                }
                double x = Zou1998DynamicMelting.extractedFraction(phi, f);
                double zou = Zou1998DynamicMelting.melt(d, p, phi, x);
                assertEquals(zou, r.instantaneousMelt(i, j) / c0, 1e-11 * zou + 1e-300, e + " at F=" + f);
                if (x > 0) {
                    // the extracted part of the accumulated melt: F·C̄_L − C_L·(melt retained)
                    double retained = phi / (1 - phi) * (1 - f);
                    double extracted = (f * r.accumulatedMelt(i, j) - retained * r.instantaneousMelt(i, j)) / c0 / x;
                    double zouAcc = Zou1998DynamicMelting.accumulatedMelt(d, p, phi, x);
                    assertEquals(zouAcc, extracted, 1e-9 * zouAcc, e + " at F=" + f);
                }
            }
        }
    }

    private static ColumnResult katz(double tpC, double step) {
        return DecompressionColumn.of(Katz2003Peridotite.fertile(), tpC + C, 0.0).withOutputStep(step).solve();
    }

    private static void assertMassBalance(CompositionResult r) {
        for (int j = 0; j < r.elements().size(); j++) {
            double c0 = r.model().source().ppm(r.elements().get(j));
            for (int i = 0; i < r.size(); i++) {
                double f = r.meltFraction(i);
                double sum = f * r.accumulatedMelt(i, j) + (1 - f) * r.residue(i, j);
                assertEquals(1.0, sum / c0, 1e-10, r.elements().get(j) + " at F=" + f);
            }
            CompositionResult.Pooled pool = r.pooledPassive(Double.POSITIVE_INFINITY);
            double fm = pool.meanMeltFraction();
            assertEquals(1.0, (fm * pool.melt(j) + (1 - fm) * pool.residue(j)) / c0, 1e-10);
            CompositionResult.Pooled cut = r.pooledPassive(0.5 * r.depth(0) + 333.0);
            fm = cut.meanMeltFraction();
            assertEquals(1.0, (fm * cut.melt(j) + (1 - fm) * cut.residue(j)) / c0, 1e-10);
            CompositionResult.Pooled act = r.pooledActive();
            fm = act.meanMeltFraction();
            assertEquals(1.0, (fm * act.melt(j) + (1 - fm) * act.residue(j)) / c0, 1e-10);
        }
    }

    @Test
    void massBalanceHoldsAlongRealColumnsInEveryModeTo1e10() {
        // Tp 1550 °C starts in the garnet field and exhausts cpx (Katz 2003); 1300 °C stays in spinel
        for (double tp : new double[] {1300, 1450, 1550}) {
            ColumnResult col = katz(tp, 1000);
            for (MeltingMode mode : MeltingMode.values()) {
                assertMassBalance(ColumnComposition.of(ALL, mode, 0.01).along(col));
            }
        }
        ColumnResult mb = DecompressionColumn.of(new McKenzieBickle1988Peridotite(), 1500 + C, 0.0).solve();
        assertMassBalance(ColumnComposition.of(ALL, MeltingMode.FRACTIONAL, 0).along(mb));
    }

    @Test
    void cpxIsExhaustedWhereTheMeltingLawSays() {
        Katz2003Peridotite katz = Katz2003Peridotite.fertile();
        ColumnResult col = katz(1550, 500);
        CompositionResult r = ColumnComposition.of(ALL, MeltingMode.FRACTIONAL, 0).along(col);
        boolean sawExhaustion = false;
        for (int i = 0; i < r.size(); i++) {
            double fExh = katz.exhaustionMeltFraction(r.pressure(i));
            if (r.meltFraction(i) < fExh - 0.003) {
                assertTrue(r.cpxInResidue(i) > 0, "cpx still present at F=" + r.meltFraction(i));
            } else if (r.meltFraction(i) > fExh + 0.003) {
                assertEquals(0.0, r.cpxInResidue(i), 0.0, "cpx gone at F=" + r.meltFraction(i));
                sawExhaustion = true;
            }
        }
        assertTrue(sawExhaustion, "a 1550 °C column exhausts cpx (Katz et al. 2003)");
    }

    @Test
    void aLawWithoutExhaustionLetsTheReactionUseCpxUp() {
        // McKenzie & Bickle (1988) has one branch: cpx runs out where 0.68 of each increment has used the 0.13
        ColumnResult col = DecompressionColumn.of(new McKenzieBickle1988Peridotite(), 1480 + C, 0.0).solve();
        CompositionResult r = ColumnComposition.of(ALL, MeltingMode.FRACTIONAL, 0).along(col);
        int top = r.size() - 1;
        assertTrue(r.meltFraction(top) > 0.2, "F at top " + r.meltFraction(top));
        assertEquals(0.0, r.cpxInResidue(top), 0.0);
    }

    @Test
    void theGarnetShareFollowsThePressureOfEachPoint() {
        CompositionResult r = ColumnComposition.of(ALL, MeltingMode.FRACTIONAL, 0).along(katz(1550, 1000));
        MantleMineralogy min = MantleMineralogy.DEFAULT;
        assertEquals(1.0, r.garnetFraction(0), 0.0);
        assertEquals(0.0, r.garnetFraction(r.size() - 1), 0.0);
        for (int i = 0; i < r.size(); i++) {
            assertEquals(min.garnetFraction(r.pressure(i)), r.garnetFraction(i), 0.0);
        }
        assertEquals(0.5, min.garnetFraction(2.95e9), 1e-12);
    }

    @Test
    void nearFractionalMeltingTendsToFractionalAndToBatchAlongAColumn() {
        ColumnResult col = katz(1350, 1000);
        List<Element> ree = Element.rareEarths();
        CompositionResult fr = ColumnComposition.of(ree, MeltingMode.FRACTIONAL, 0).along(col);
        CompositionResult ba = ColumnComposition.of(ree, MeltingMode.BATCH, 0).along(col);
        CompositionResult tiny = ColumnComposition.of(ree, MeltingMode.NEAR_FRACTIONAL, 1e-12).along(col);
        int top = fr.size() - 1;
        double fTop = fr.meltFraction(top);
        CompositionResult all = ColumnComposition.of(ree, MeltingMode.NEAR_FRACTIONAL, fTop).along(col);
        for (int j = 0; j < ree.size(); j++) {
            assertEquals(fr.instantaneousMelt(top, j), tiny.instantaneousMelt(top, j),
                    1e-6 * fr.instantaneousMelt(top, j));
            assertEquals(fr.accumulatedMelt(top, j), tiny.accumulatedMelt(top, j), 1e-7 * fr.accumulatedMelt(top, j));
            // retained fraction equal to the F at the top: nothing has left, the melt is the batch melt
            assertEquals(ba.instantaneousMelt(top, j), all.instantaneousMelt(top, j),
                    1e-12 * ba.instantaneousMelt(top, j));
            double previous = Double.POSITIVE_INFINITY;
            for (double phi : new double[] {0.0, 0.005, 0.02, 0.08, 0.9 * fTop}) {
                double c = ColumnComposition.of(ree, MeltingMode.NEAR_FRACTIONAL, phi).along(col)
                        .instantaneousMelt(top, j);
                double gap = Math.abs(Math.log(c / ba.instantaneousMelt(top, j)));
                assertTrue(gap < previous, ree.get(j) + " moves towards batch as φ grows, φ=" + phi);
                previous = gap;
            }
        }
    }

    @Test
    void theResultDoesNotDependOnTheOutputSpacingBeyondTheTransitionSteps() {
        // 1 km against 100 m output steps: only the piecewise garnet share and cpx exhaustion pressure differ
        CompositionResult coarse = ColumnComposition.of(ALL, MeltingMode.FRACTIONAL, 0).along(katz(1500, 1000));
        CompositionResult fine = ColumnComposition.of(ALL, MeltingMode.FRACTIONAL, 0).along(katz(1500, 100));
        CompositionResult.Pooled a = coarse.pooledPassive(Double.POSITIVE_INFINITY);
        CompositionResult.Pooled b = fine.pooledPassive(Double.POSITIVE_INFINITY);
        for (int j = 0; j < ALL.size(); j++) {
            assertEquals(b.melt(j), a.melt(j), 2e-3 * b.melt(j), ALL.get(j).symbol());
        }
        assertEquals(b.meanMeltFraction(), a.meanMeltFraction(), 1e-4);
    }

    @Test
    void aColumnWithoutMeltHasNoPooledMelt() {
        CompositionResult r = ColumnComposition.of(ALL, MeltingMode.FRACTIONAL, 0).along(katz(1050, 1000));
        assertEquals(0, r.size());
        assertThrows(EngineException.class, r::pooledActive);
    }

    @Test
    void missingDataIsRefusedNamingTheElement() {
        ElementAbundances partial = new ElementAbundances("x", List.of(), java.util.Map.of(Element.LA, 1.0));
        EngineException ex = assertThrows(EngineException.class, () -> new ColumnComposition(List.of(Element.LA,
                Element.SM), partial, CompositionTables.defaultPartitionCoefficients(), MantleMineralogy.DEFAULT,
                MeltingMode.BATCH, 0));
        assertTrue(ex.getMessage().contains("Sm"));
        assertThrows(EngineException.class, () -> ColumnComposition.of(ALL, MeltingMode.NEAR_FRACTIONAL, 0.5));
        assertThrows(EngineException.class, () -> CompositionTables.defaultPartitionCoefficients().scaled(-1));
    }
}
