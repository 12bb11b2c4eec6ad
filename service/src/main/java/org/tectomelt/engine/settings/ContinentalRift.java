package org.tectomelt.engine.settings;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.tectomelt.engine.DeferredList;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.MantleSource;
import org.tectomelt.engine.column.MeltingColumn;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * A continental rift made by instantaneous, uniform (pure-shear) stretching of the lithosphere by a
 * factor β (McKenzie 1978): a lithosphere of thickness a thins to a/β and its crust c to c/β, and
 * the asthenosphere rises passively by a(1 − 1/β) to fill the space, melting isentropically up to
 * the new base of the lid (White &amp; McKenzie 1989).
 *
 * <p>Melt made by the stretching, per unit area of the stretched rift:
 * <pre>
 *   h(β) = ∫ from a/β to min(a, z_onset) of F(z) dz
 * </pre>
 * where F(z) is the isentropic melt fraction at depth z. A parcel now at depth z came from
 * z + a(1 − 1/β); the melt it carried before stretching (only where the unstretched lithosphere is
 * thinner than the onset depth) is not counted, which leaves exactly the part of the column between
 * the new and the old lid base. h is zero below the onset stretching factor β₀, the root of
 * a/β₀ = z_onset(β₀) (the onset depth shifts slightly with β because the thinned crust is lighter
 * than mantle); it is found with Brent's method. Pressures come from the stretched column, crust of
 * 2800 kg/m³ over mantle of the lithology's solid density.
 *
 * <p>Instantaneous stretching neglects conductive cooling during rifting, so it gives the largest
 * melt thickness for a given β (McKenzie &amp; Bickle 1988 discuss finite stretching times).
 *
 * @param source               the mantle source (lithologies and melting mode)
 * @param potentialTemperature potential temperature of the asthenosphere (K)
 * @param stretchingFactor     β ≥ 1
 * @param lithosphereThickness thickness a of the unstretched lithosphere (m)
 * @param crustThickness       thickness c of the unstretched crust (m), less than a
 * @param bulkWater            bulk water of the mantle source (mass fraction)
 */
public record ContinentalRift(MantleSource source, double potentialTemperature, double stretchingFactor,
                              double lithosphereThickness, double crustThickness, double bulkWater) {

    /** Uniform stretching of the lithosphere. */
    public static final ModelInfo INFO = new ModelInfo("uniform-stretching-mckenzie1978",
            "McKenzie, D. (1978) Some remarks on the development of sedimentary basins. Earth and Planetary "
                    + "Science Letters 40(1), 25-32",
            "10.1016/0012-821X(78)90071-7");
    /** Decompression melting beneath a stretched lithosphere. */
    public static final ModelInfo RIFT_MELTING_INFO = new ModelInfo("rift-melting-white-mckenzie1989",
            "White, R. & McKenzie, D. (1989) Magmatism at rift zones: the generation of volcanic continental margins "
                    + "and flood basalts. Journal of Geophysical Research 94(B6), 7685-7729",
            "10.1029/JB094iB06p07685");
    /** Largest stretching factor searched for the onset. */
    public static final double MAX_STRETCHING_FACTOR = 1e4;

    /** A rift over one lithology melting in batch. */
    public ContinentalRift(MantleLithology lithology, double potentialTemperature, double stretchingFactor,
                           double lithosphereThickness, double crustThickness, double bulkWater) {
        this(MantleSource.of(lithology), potentialTemperature, stretchingFactor, lithosphereThickness, crustThickness,
                bulkWater);
    }

    /** The source's main lithology. */
    public MantleLithology lithology() {
        return source.peridotite();
    }

    /** Validates the geometry. */
    public ContinentalRift {
        if (!(stretchingFactor >= 1) || !Double.isFinite(stretchingFactor)) {
            throw new EngineException("the stretching factor must be at least 1");
        }
        if (!(lithosphereThickness > 0) || !(crustThickness >= 0) || !(crustThickness < lithosphereThickness)) {
            throw new EngineException("the crust must be thinner than the lithosphere");
        }
    }

    /**
     * The result of a rift.
     *
     * @param column                 the passive melting column beneath the stretched lid
     * @param lidDepth               base of the stretched lithosphere a/β (m)
     * @param stretchedCrust         crust thickness after stretching c/β (m)
     * @param onsetStretchingFactor  the β at which melting begins; empty when the mantle never melts
     * @param meltThickness          melt made by the stretching, ∫F dz from a/β to min(a, z_onset) (m)
     * @param igneousCrustThickness  igneous crust (or underplate) made from it, meltThickness·ρs/ρc (m)
     * @param models                 published models used
     * @param assumptions            assumptions in words
     * @param warnings               validity notes
     */
    public record Result(ColumnResult column, double lidDepth, double stretchedCrust,
                         OptionalDouble onsetStretchingFactor, double meltThickness, double igneousCrustThickness,
                         List<ModelInfo> models, List<String> assumptions, List<String> warnings) {
        /** Defensive copies. */
        public Result {
            models = List.copyOf(models);
            assumptions = DeferredList.copyOf(assumptions);
            warnings = List.copyOf(warnings);
        }
    }

    /** The column beneath the lithosphere stretched by {@code beta}, melting up to a/β. */
    public MeltingColumn columnAt(double beta) {
        MeltingColumn base = source.column(potentialTemperature, bulkWater);
        LithostaticColumn pressures = new LithostaticColumn(crustThickness / beta, LithostaticColumn.CRUST_DENSITY,
                base.thermodynamics().solidDensity(), LithostaticColumn.G);
        return base.withPressures(pressures).withLidDepth(lithosphereThickness / beta).withUpwelling(Upwelling.PASSIVE)
                .withOutputStep(MidOceanRidge.PROFILE_STEP);
    }

    /**
     * The stretching factor at which melting begins, or empty when the adiabat never meets the
     * solidus; 1 when the unstretched lithosphere is already thinner than the onset depth.
     */
    public OptionalDouble onsetStretchingFactor() {
        if (columnAt(1.0).onsetDepth().isEmpty()) {
            return OptionalDouble.empty();
        }
        if (lidMinusOnset(1.0) <= 0) {
            return OptionalDouble.of(1.0);
        }
        double hi = 2.0;
        while (lidMinusOnset(hi) > 0) {
            hi *= 2;
            if (hi > MAX_STRETCHING_FACTOR) {
                return OptionalDouble.empty();
            }
        }
        return OptionalDouble.of(new BrentSolver(1e-10, 1e-12).solve(200, this::lidMinusOnset, hi / 2, hi));
    }

    /** a/β − z_onset(β) (m). */
    private double lidMinusOnset(double beta) {
        OptionalDouble z = columnAt(beta).onsetDepth();
        return lithosphereThickness / beta - (z.isPresent() ? z.getAsDouble() : 0.0);
    }

    /** Runs the rift. */
    public Result solve() {
        MeltingColumn col = columnAt(stretchingFactor);
        ColumnResult c = col.solve();
        double before = 0.0;
        if (c.onset().isPresent() && c.onset().get().depth() > lithosphereThickness) {
            before = col.withLidDepth(lithosphereThickness).solve().meltIntegral();
        }
        double melt = Math.max(0.0, c.meltIntegral() - before);
        double igneous = melt * col.thermodynamics().solidDensity() / col.crustDensity();
        OptionalDouble onsetBeta = onsetStretchingFactor();
        List<ModelInfo> models = new ArrayList<>(c.models());
        models.add(INFO);
        models.add(RIFT_MELTING_INFO);
        // the text is built when read (an answer reads it, a run's point does not)
        List<String> assumptions = DeferredList.of(() -> {
            List<String> a = new ArrayList<>(c.assumptions());
            a.add(String.format(Locale.ROOT, "rift: instantaneous uniform stretching by β = %.3g (McKenzie 1978) "
                    + "thins the lithosphere to a/β = %.1f km and the crust to c/β = %.1f km; the asthenosphere rises "
                    + "passively and melts up to a/β (White & McKenzie 1989); no conductive cooling during stretching; "
                    + "melt thickness counts only melt made by the stretching (∫F dz between a/β and the old lid base "
                    + "or the onset)", stretchingFactor, lithosphereThickness / stretchingFactor / 1e3,
                    crustThickness / stretchingFactor / 1e3));
            return a;
        });
        List<String> warnings = new ArrayList<>(c.warnings());
        if (onsetBeta.isPresent() && onsetBeta.getAsDouble() == 1.0) {
            warnings.add("the unstretched lithosphere is already thinner than the onset depth: the mantle beneath it "
                    + "would be melting before any stretching; only the extra melt from stretching is counted");
        } else if (onsetBeta.isPresent() && stretchingFactor < onsetBeta.getAsDouble()) {
            warnings.add(String.format(Locale.ROOT, "no melt: stretching by %.3g is below the %.3g needed to bring "
                    + "the lid base up to the onset of melting", stretchingFactor, onsetBeta.getAsDouble()));
        }
        return new Result(c, lithosphereThickness / stretchingFactor, crustThickness / stretchingFactor, onsetBeta,
                melt, igneous, models, assumptions, warnings);
    }
}
