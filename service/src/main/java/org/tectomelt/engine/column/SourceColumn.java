package org.tectomelt.engine.column;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.function.DoubleUnaryOperator;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.melting.MantleThermodynamics;
import org.tectomelt.engine.thermal.LithostaticColumn;

/**
 * An isentropic decompression column of a {@link MantleSource}: one or two lithologies in thermal
 * equilibrium, each melting by its own law, in batch, fractional or near-fractional mode, stepped in
 * depth with the entropy balance solved exactly at every step.
 *
 * <p><b>Two lithologies.</b> The rocks rise together at one temperature and exchange heat freely
 * (thermal equilibrium), each melting by its own F_i(P, T); the latent heat of both is drawn from the
 * common temperature. This is the method of Phipps Morgan (2001) for a "veined" mantle and of
 * Shorttle, Maclennan &amp; Lambart (2014). Per unit mass of source, with φ_i the mass fractions:
 * <pre>
 *   Σ_i φ_i [ m_i (cp_i dT/T − a_i dP) + ΔS_i dF_i ] = 0
 * </pre>
 * where for batch melting m_i = 1 and a_i = F_i αf/ρf + (1 − F_i) αs/ρs (the isentropic productivity
 * of Katz et al. 2003 for one lithology). Below every solidus this is the solid adiabat of the mixture,
 * T = Tp·exp(Σφ_i αs_i/ρs_i · P / Σφ_i cp_i). The deeper solidus (the pyroxenite's) is met first, and
 * its melting cools the peridotite too, so the peridotite meets its solidus shallower than alone.
 *
 * <p><b>Fractional and near-fractional melting.</b> Melt beyond a retained fraction φ (0 for
 * fractional) leaves the residue as it forms, with its entropy: the remaining system (residue and
 * retained melt), of mass m_i = (1 − F_i)/(1 − φ) per unit source, keeps its own specific entropy
 * while the melt carries off s_melt = s_solid + ΔS, so in the balance above m_i = (1 − F_i)/(1 − φ)
 * and a_i = φ αf/ρf + (1 − φ) αs/ρs once F_i &gt; φ (isentropic fractional melting of Asimow,
 * Hirschmann &amp; Stolper 1997; energy carried off by the extracted melt, Asimow &amp; Langmuir 2003).
 * F_i is the extent of melting (mass melted per unit source); the residue after extraction is taken to
 * follow the same T(P, F) law at its extent of melting (common practice for parameterized laws). The
 * latent heat is drawn from an ever smaller mass, so fractional melting is a little less productive
 * than batch (a few per cent in F; tested). Extracted melt never returns: F_i only grows.
 *
 * <p><b>Water.</b> Batch: the bulk water stays and partitions, X_melt = Xbulk/(D + F(1 − D)). Fractional
 * modes: each increment of melt leaves with the water of the melt present, X_melt = X_sys/(D + φ(1 − D)),
 * so the system's water falls as X_sys = X₀·[(1 − F)/(1 − φ)]^(1/(D + φ(1 − D)) − 1) (Shaw 1970's
 * fractional law for the residue; φ = 0 gives X₀(1 − F)^(1/D − 1)); the solidus then rises and the
 * hydrous tail below the dry solidus is short: the residue may stop melting until it reaches its
 * drier solidus (the "water stripped" behaviour of Asimow &amp; Langmuir 2003). The water belongs to the
 * peridotite; the second lithology is dry. A fractional mode with water needs a law that states its
 * water partition coefficient D ({@link MantleLithology#waterPartition}).
 *
 * <p><b>Numerics.</b> Steps of at most {@value #MAX_STEP_M} m between the output depths; at each step
 * the balance (trapezoidal in m_i and a_i, exact in T through ln T and in F_i) is solved for the new
 * temperature to {@value #TEMPERATURE_TOLERANCE_K} K, the melt fractions following from their laws at
 * that temperature: by secant iterations from the solid adiabat, the first move taken with the previous
 * step's slope of the residual (three to four evaluations a step where the column is smooth), and by an
 * Illinois-modified regula falsi on an expanding bracket where the secant gives up (the first step, an
 * onset, cpx exhaustion, a residue that stops melting). Each law is read at the step's pressure once
 * ({@link org.tectomelt.engine.melting.Lithology#meltFractionAt}). ∫F dz and the pressure moments are
 * trapezoidal. A single lithology in batch reproduces {@link DecompressionColumn} to about 1e-4
 * relative in the crust (tested); a second lithology's onset is located by linear interpolation of
 * T − T_solidus within its step.
 *
 * @param source               the lithologies and the melting mode
 * @param potentialTemperature mantle potential temperature Tp (K)
 * @param bulkWater            bulk water of the peridotite (mass fraction)
 * @param lidDepth             depth of the lid base (m), where melting stops; 0 for the surface
 * @param upwelling            passive (triangular) or active (columnar) upwelling
 * @param outputStep           depth spacing of the output profile (m)
 * @param pressures            pressure with depth along the column
 * @param crustDensity         density ρc of the crust the melt makes (kg/m³)
 */
public record SourceColumn(MantleSource source, double potentialTemperature, double bulkWater, double lidDepth,
                           Upwelling upwelling, double outputStep, LithostaticColumn pressures, double crustDensity)
        implements MeltingColumn {

    /** Two lithologies melting in thermal equilibrium. */
    public static final ModelInfo TWO_LITHOLOGY_INFO = new ModelInfo("two-lithology-melting-phipps-morgan2001",
            "Phipps Morgan, J. (2001) Thermodynamics of pressure release melting of a veined plum pudding mantle. "
                    + "Geochemistry, Geophysics, Geosystems 2(4), 2000GC000049; as also applied by Shorttle, O., "
                    + "Maclennan, J. & Lambart, S. (2014) Quantifying lithological variability in the mantle",
            "10.1029/2000GC000049");
    /** Isentropic fractional melting. */
    public static final ModelInfo FRACTIONAL_INFO = new ModelInfo("fractional-melting-asimow1997",
            "Asimow, P.D., Hirschmann, M.M. & Stolper, E.M. (1997) An analysis of variations in isentropic melt "
                    + "productivity. Philosophical Transactions of the Royal Society A 355, 255-281",
            "10.1098/rsta.1997.0009");
    /** Water leaving the residue with the melt. */
    public static final ModelInfo WATER_EXTRACTION_INFO = new ModelInfo("hydrous-fractional-asimow-langmuir2003",
            "Asimow, P.D. & Langmuir, C.H. (2003) The importance of water to oceanic mantle melting regimes. "
                    + "Nature 421, 815-820",
            "10.1038/nature01429");

    /** Largest integration step (m). */
    public static final double MAX_STEP_M = 1000.0;
    /** Convergence of the temperature at each step (K). */
    public static final double TEMPERATURE_TOLERANCE_K = 1e-9;

    private static final double GRID_SLACK = 1e-6;
    private static final int MAX_ITERATIONS = 100;
    private static final int SECANT_ITERATIONS = 8;
    private static final double SECANT_MAX_MOVE_K = 20.0;

    /** Validates the inputs. */
    public SourceColumn {
        if (source == null || upwelling == null || pressures == null) {
            throw new IllegalArgumentException("source, upwelling and pressures are required");
        }
        DecompressionColumn.checkCommon(potentialTemperature, lidDepth, outputStep, crustDensity);
        MantleLithology per = source.peridotite();
        DecompressionColumn.checkWater(per, bulkWater);
        if (bulkWater > 0 && source.mode() != MeltingMode.BATCH && !(per.waterPartition() > 0)) {
            throw new EngineException(per.id() + " states no water partition coefficient, so it cannot run "
                    + source.mode().apiName() + " melting with water; allowed: batch");
        }
    }

    /** The column with the defaults of {@link DecompressionColumn#of}. */
    public static SourceColumn of(MantleSource source, double potentialTemperature, double bulkWater) {
        MantleThermodynamics th = mixture(source);
        return new SourceColumn(source, potentialTemperature, bulkWater, 0.0, Upwelling.PASSIVE,
                DecompressionColumn.DEFAULT_OUTPUT_STEP, new LithostaticColumn(0.0, LithostaticColumn.CRUST_DENSITY,
                th.solidDensity(), LithostaticColumn.G), DecompressionColumn.DEFAULT_CRUST_DENSITY);
    }

    @Override
    public SourceColumn withLidDepth(double depth) {
        return new SourceColumn(source, potentialTemperature, bulkWater, depth, upwelling, outputStep, pressures,
                crustDensity);
    }

    @Override
    public SourceColumn withUpwelling(Upwelling regime) {
        return new SourceColumn(source, potentialTemperature, bulkWater, lidDepth, regime, outputStep, pressures,
                crustDensity);
    }

    @Override
    public SourceColumn withOutputStep(double step) {
        return new SourceColumn(source, potentialTemperature, bulkWater, lidDepth, upwelling, step, pressures,
                crustDensity);
    }

    @Override
    public SourceColumn withPressures(LithostaticColumn column) {
        return new SourceColumn(source, potentialTemperature, bulkWater, lidDepth, upwelling, outputStep, column,
                crustDensity);
    }

    @Override
    public MeltingMode mode() {
        return source.mode();
    }

    @Override
    public MantleThermodynamics thermodynamics() {
        return mixture(source);
    }

    /** The lithologies of the source, peridotite first. */
    public List<MantleLithology> lithologies() {
        return source.pyroxenite() == null ? List.of(source.peridotite())
                : List.of(source.peridotite(), source.pyroxenite());
    }

    /** Their mass fractions, in the same order. */
    public double[] massFractions() {
        return source.pyroxenite() == null ? new double[] {1.0}
                : new double[] {1.0 - source.pyroxeniteFraction(), source.pyroxeniteFraction()};
    }

    /**
     * Mass-weighted constants of the source: cp and ΔS averaged by mass, specific volumes 1/ρ and
     * α/ρ by mass (so the mixture's solid adiabat is exact), densities from the volumes.
     */
    static MantleThermodynamics mixture(MantleSource s) {
        MantleThermodynamics a = s.peridotite().thermodynamics();
        if (s.pyroxenite() == null) {
            return a;
        }
        MantleThermodynamics b = s.pyroxenite().thermodynamics();
        double x = s.pyroxeniteFraction();
        double y = 1.0 - x;
        double vs = y / a.solidDensity() + x / b.solidDensity();
        double vf = y / a.meltDensity() + x / b.meltDensity();
        double as = y * a.solidExpansivity() / a.solidDensity() + x * b.solidExpansivity() / b.solidDensity();
        double af = y * a.meltExpansivity() / a.meltDensity() + x * b.meltExpansivity() / b.meltDensity();
        return new MantleThermodynamics(y * a.heatCapacity() + x * b.heatCapacity(),
                y * a.entropyOfFusion() + x * b.entropyOfFusion(), as / vs, af / vf, 1.0 / vs, 1.0 / vf);
    }

    /**
     * A one-lithology batch column of lithology {@code i} on the mixture's solid adiabat (its cp and
     * αs/ρs those of the mixture): used to find where lithology {@code i} meets its solidus.
     */
    private DecompressionColumn probe(int i) {
        MantleLithology l = lithologies().get(i);
        MantleThermodynamics mix = thermodynamics();
        MantleThermodynamics own = l.thermodynamics();
        double aMix = mix.solidExpansivity() / mix.solidDensity();
        MantleThermodynamics th = new MantleThermodynamics(mix.heatCapacity(), own.entropyOfFusion(),
                aMix * own.solidDensity(), own.meltExpansivity(), own.solidDensity(), own.meltDensity());
        return new DecompressionColumn(l, th, potentialTemperature, i == 0 ? bulkWater : 0.0, lidDepth, upwelling,
                outputStep, pressures, crustDensity);
    }

    /** The deepest pressure at which one of the lithologies meets its solidus on the mixture's adiabat. */
    @Override
    public OptionalDouble onsetPressure() {
        OptionalDouble deepest = OptionalDouble.empty();
        for (int i = 0; i < lithologies().size(); i++) {
            OptionalDouble p = probe(i).onsetPressure();
            if (p.isPresent() && (deepest.isEmpty() || p.getAsDouble() > deepest.getAsDouble())) {
                deepest = p;
            }
        }
        return deepest;
    }

    /** Temperature (K) of the mixture's melt-free solid adiabat at pressure {@code p} (Pa). */
    public double adiabatTemperature(double p) {
        MantleThermodynamics th = thermodynamics();
        return potentialTemperature * Math.exp(th.solidExpansivity() * p / (th.solidDensity() * th.heatCapacity()));
    }

    @Override
    public List<ModelInfo> models() {
        Set<ModelInfo> m = new LinkedHashSet<>();
        for (MantleLithology l : lithologies()) {
            m.addAll(l.citations());
        }
        m.add(DecompressionColumn.INFO);
        if (source.pyroxenite() != null) {
            m.add(TWO_LITHOLOGY_INFO);
        }
        if (source.mode() != MeltingMode.BATCH) {
            m.add(FRACTIONAL_INFO);
            if (bulkWater > 0) {
                m.add(WATER_EXTRACTION_INFO);
            }
        }
        if (upwelling == Upwelling.PASSIVE) {
            m.add(DecompressionColumn.PASSIVE_REGIME_INFO);
        }
        m.add(DecompressionColumn.MEAN_PRESSURE_INFO);
        m.add(LithostaticColumn.INFO);
        return List.copyOf(m);
    }

    @Override
    public List<String> assumptions() {
        MantleThermodynamics th = thermodynamics();
        List<String> a = new ArrayList<>();
        a.add(String.format(Locale.ROOT, "isentropic decompression: below every solidus the solid adiabat of the "
                        + "source; while melting the latent heat cools the rock; no conductive heat loss; source constants "
                        + "(mass-weighted) cp = %.0f J/kg/K, ΔS = %.0f J/kg/K, αs = %.2g /K, αf = %.2g /K, ρs = %.0f kg/m³, "
                        + "ρf = %.0f kg/m³", th.heatCapacity(), th.entropyOfFusion(), th.solidExpansivity(),
                th.meltExpansivity(), th.solidDensity(), th.meltDensity()));
        if (source.pyroxenite() != null) {
            a.add(String.format(Locale.ROOT, "two lithologies in thermal equilibrium (Phipps Morgan 2001; Shorttle et al. "
                    + "2014): %.3g of %s in %s by mass, one temperature, each melting by its own law and drawing its "
                    + "latent heat from the shared heat; the water is the peridotite's, the second lithology is dry; "
                    + "melt fractions are extents of melting of each lithology, the column's F their mass-weighted sum",
                    source.pyroxeniteFraction(), source.pyroxenite().id(), source.peridotite().id()));
        }
        switch (source.mode()) {
            case BATCH -> a.add("batch melting: the melt stays with its residue up to the top; the bulk water stays and "
                    + "partitions between residue and melt, X_melt = Xbulk/(D + F(1 - D))");
            case FRACTIONAL -> a.add("fractional melting: every increment of melt leaves at once with its water and "
                    + "its entropy (Asimow et al. 1997; Asimow & Langmuir 2003); the residue's water falls as "
                    + "X0(1 - F)^(1/D - 1); F is the extent of melting and the residue follows the same T(P, F) law");
            default -> a.add(String.format(Locale.ROOT, "near-fractional melting: the residue keeps %.3g of melt in "
                    + "equilibrium, the rest leaves at once with its water and entropy (Asimow et al. 1997; Asimow & "
                    + "Langmuir 2003); batch until F reaches it; the system's water falls as "
                    + "X0((1 - F)/(1 - phi))^(1/(D + phi(1 - D)) - 1)", source.retainedMeltFraction()));
        }
        a.addAll(DecompressionColumn.regimeAssumptions(this));
        a.add(String.format(Locale.ROOT, "numerics: entropy balance solved exactly at steps of at most %.0f m "
                + "(trapezoidal in the expansivity term), temperature to %.0e K", Math.min(MAX_STEP_M, outputStep),
                TEMPERATURE_TOLERANCE_K));
        return a;
    }

    @Override
    public ColumnResult solve() {
        List<String> warnings = new ArrayList<>();
        OptionalDouble onsetP = onsetPressure();
        int n = lithologies().size();
        if (onsetP.isEmpty()) {
            warnings.add(String.format(Locale.ROOT,
                    "no melting: the adiabat of potential temperature %.0f °C stays below every solidus all the way "
                            + "to the surface", potentialTemperature - 273.15));
            return noMelt(Optional.empty(), warnings);
        }
        double p0 = onsetP.getAsDouble();
        double z0 = pressures.depthAt(p0);
        ColumnState onset = new ColumnState(z0, p0, adiabatTemperature(p0), 0.0);
        if (z0 <= lidDepth) {
            warnings.add(String.format(Locale.ROOT,
                    "no melting: the lid base at %.1f km is deeper than the onset of melting at %.1f km",
                    lidDepth / 1e3, z0 / 1e3));
            return noMelt(Optional.of(onset), warnings);
        }
        return new Run(n, onset).integrate(warnings);
    }

    private ColumnResult noMelt(Optional<ColumnState> onset, List<String> warnings) {
        List<LithologyMelting> per = new ArrayList<>();
        double[] phi = massFractions();
        for (int i = 0; i < phi.length; i++) {
            per.add(new LithologyMelting(lithologies().get(i), phi[i], Optional.empty(), 0.0, 0.0, 0.0));
        }
        return new ColumnResult(this, onset, Optional.empty(), 0.0, 0.0, 0.0, 0.0, 0.0, OptionalDouble.empty(),
                List.of(), List.copyOf(new LinkedHashSet<>(warnings)), per);
    }

    /** One run: the state marched from the onset to the top. */
    private final class Run {
        private final int n;
        private final ColumnState onset;
        private final MantleLithology[] lith;
        private final MantleThermodynamics[] th;
        private final double[] phi;
        private final double[] water0;
        private final double[] partition;
        private final boolean fractional;
        private final double retained;
        private final double[] f;
        private final double[] trial;
        private final DoubleUnaryOperator[] laws;
        private final double[] maxFi;
        private final double[] shareIntegral;
        private final ColumnState[] onsets;
        private final List<ProfilePoint> profile = new ArrayList<>();
        private double t;
        private double dp;
        /** ∂r/∂T at the previous step's solution (0 until a step has been bracketed). */
        private double slope;

        Run(int n, ColumnState onset) {
            this.n = n;
            this.onset = onset;
            List<MantleLithology> ls = lithologies();
            lith = ls.toArray(new MantleLithology[0]);
            th = new MantleThermodynamics[n];
            phi = massFractions();
            water0 = new double[n];
            partition = new double[n];
            for (int i = 0; i < n; i++) {
                th[i] = lith[i].thermodynamics();
                water0[i] = i == 0 ? bulkWater : 0.0;
                partition[i] = lith[i].waterPartition();
            }
            fractional = source.mode() != MeltingMode.BATCH;
            retained = source.retainedMeltFraction();
            f = new double[n];
            trial = new double[n];
            laws = new DoubleUnaryOperator[n];
            maxFi = new double[n];
            shareIntegral = new double[n];
            onsets = new ColumnState[n];
        }

        ColumnResult integrate(List<String> warnings) {
            double zTop = lidDepth;
            double z = onset.depth();
            t = onset.temperature();
            for (int i = 0; i < n; i++) {
                if (lith[i].temperatureAt(onset.pressure(), 0.0, water0[i]) <= t + 1e-6) {
                    onsets[i] = onset;
                    warnings.addAll(lith[i].melt(onset.pressure(), t, water0[i]).warnings());
                }
            }
            profile.add(point(z, onset.pressure(), 0.0));
            double integral = 0;
            double momentPassive = 0;
            double momentActive = 0;
            double maxF = 0;
            double fBulk = 0;
            double nextGrid = Math.floor(z / outputStep - GRID_SLACK) * outputStep;
            boolean firstStep = true;
            while (z > zTop + GRID_SLACK) {
                double target = Math.max(nextGrid, zTop);
                int sub = (int) Math.ceil((z - target) / MAX_STEP_M - GRID_SLACK);
                double h = (z - target) / Math.max(sub, 1);
                double productivity = 0;
                for (int s = 0; s < Math.max(sub, 1); s++) {
                    double zNext = s == sub - 1 ? target : z - h;
                    double pNow = pressures.pressureAt(z);
                    double pNext = pressures.pressureAt(zNext);
                    double tBefore = t;
                    step(pNow, pNext);
                    double fNew = 0;
                    for (int i = 0; i < n; i++) {
                        fNew += phi[i] * trial[i];
                    }
                    integral += 0.5 * (fBulk + fNew) * (z - zNext);
                    double pMid = 0.5 * (pNow + pNext);
                    double zMid = 0.5 * (z + zNext);
                    momentPassive += pMid * (fNew - fBulk) * (zMid - zTop);
                    momentActive += pMid * (fNew - fBulk);
                    productivity = (fNew - fBulk) / (pNow - pNext);
                    for (int i = 0; i < n; i++) {
                        shareIntegral[i] += 0.5 * phi[i] * (f[i] + trial[i]) * (z - zNext);
                        if (onsets[i] == null && trial[i] > 0) {
                            onsets[i] = interpolatedOnset(i, z, pNow, tBefore, zNext, pNext, t);
                            warnings.addAll(lith[i].melt(onsets[i].pressure(), onsets[i].temperature(), water0[i])
                                    .warnings());
                        }
                        f[i] = trial[i];
                        maxFi[i] = Math.max(maxFi[i], f[i]);
                        if (f[i] >= 1.0) {
                            throw new EngineException(String.format(Locale.ROOT, "the column reaches the liquidus of "
                                    + "%s at %.1f km: the melting law gives no number beyond it; lower the potential "
                                    + "temperature", lith[i].id(), zNext / 1e3));
                        }
                    }
                    fBulk = fNew;
                    maxF = Math.max(maxF, fBulk);
                    z = zNext;
                    if (firstStep) {
                        profile.set(0, withProductivity(profile.get(0), productivity));
                        firstStep = false;
                    }
                }
                profile.add(point(z, pressures.pressureAt(z), productivity));
                nextGrid -= outputStep;
            }
            double pTop = pressures.pressureAt(zTop);
            ColumnState top = new ColumnState(zTop, pTop, t, fBulk);
            double height = onset.depth() - zTop;
            double thickness = upwelling == Upwelling.PASSIVE ? integral : maxF * height;
            OptionalDouble meanP;
            if (upwelling == Upwelling.PASSIVE) {
                meanP = integral > 0 ? OptionalDouble.of(momentPassive / integral) : OptionalDouble.empty();
            } else {
                meanP = fBulk > 0 ? OptionalDouble.of(momentActive / fBulk) : OptionalDouble.empty();
            }
            double crust = thickness * thermodynamics().solidDensity() / crustDensity;
            if (!fractional && bulkWater > 0 && f[0] > 0 && lith[0].melt(pTop, t, bulkWater).waterSaturated()) {
                warnings.add("the melt is water-saturated at the top of the column: water exsolves there and the "
                        + "melt partly crystallises as the solidus rises (degassing)");
            }
            List<LithologyMelting> per = new ArrayList<>(n);
            for (int i = 0; i < n; i++) {
                double share;
                if (upwelling == Upwelling.PASSIVE) {
                    share = integral > 0 ? shareIntegral[i] / integral : 0.0;
                } else {
                    share = fBulk > 0 ? phi[i] * f[i] / fBulk : 0.0;
                }
                per.add(new LithologyMelting(lith[i], phi[i], Optional.ofNullable(onsets[i]), maxFi[i], f[i], share));
            }
            return new ColumnResult(SourceColumn.this, Optional.of(onset), Optional.of(top), maxF, integral / height,
                    integral, thickness, crust, meanP, profile, List.copyOf(new LinkedHashSet<>(warnings)), per);
        }

        /** Where lithology i met its solidus within the step (z1, p1, t1) → (z2, p2, t2): linear in T − Ts. */
        private ColumnState interpolatedOnset(int i, double z1, double p1, double t1, double z2, double p2, double t2) {
            double e1 = t1 - lith[i].temperatureAt(p1, 0.0, water0[i]);
            double e2 = t2 - lith[i].temperatureAt(p2, 0.0, water0[i]);
            double w = e1 < e2 && e1 <= 0 ? Math.min(1.0, Math.max(0.0, e1 / (e1 - e2))) : 0.0;
            return new ColumnState(z1 + w * (z2 - z1), p1 + w * (p2 - p1), t1 + w * (t2 - t1), 0.0);
        }

        /** Mass of the melting system per unit source (1 in batch; (1 − F)/(1 − φ) once melt leaves). */
        private double mass(double fi) {
            return fractional && fi > retained ? (1.0 - fi) / (1.0 - retained) : 1.0;
        }

        /** Σ(x α/ρ) of the system: melt fraction F (batch) or φ (once melt leaves) of melt, the rest solid. */
        private double expansion(int i, double fi) {
            double x = fractional && fi > retained ? retained : fi;
            return x * th[i].meltExpansivity() / th[i].meltDensity()
                    + (1.0 - x) * th[i].solidExpansivity() / th[i].solidDensity();
        }

        /** Water of the melting system of lithology i at extent F (mass fraction). */
        private double systemWater(int i, double fi) {
            if (water0[i] == 0 || !fractional || fi <= retained) {
                return water0[i];
            }
            double d = partition[i];
            double exponent = 1.0 / (d + retained * (1.0 - d)) - 1.0;
            return water0[i] * Math.pow((1.0 - fi) / (1.0 - retained), exponent);
        }

        /** Water in the melt present in lithology i at extent F. */
        private double meltWater(int i, double p, double fi) {
            if (water0[i] == 0 || fi <= 0) {
                return 0.0;
            }
            if (!fractional || fi <= retained) {
                return lith[i].waterInMelt(p, fi, water0[i]);
            }
            return lith[i].waterInMelt(p, retained, systemWater(i, fi));
        }

        /** The extent of melting of lithology i at (p, T) by its law, given how melt leaves. */
        private double extent(int i, double p, double temp) {
            double batch = laws[i].applyAsDouble(temp);
            if (!fractional) {
                return batch;
            }
            double g = batch;
            if (water0[i] > 0 && batch > retained) {
                g = hydrousExtent(i, p, temp);
            }
            return Math.max(f[i], g);
        }

        /** Root of F − F_law(P, T, X_melt(F)) on [φ, 1]: the melt present carries the system's water. */
        private double hydrousExtent(int i, double p, double temp) {
            double lo = retained;
            double hi = 1.0;
            for (int k = 0; k < 200 && hi - lo > 1e-13; k++) {
                double mid = 0.5 * (lo + hi);
                double g = mid - lith[i].meltFractionAtMeltWater(p, temp, lith[i].waterInMelt(p, retained,
                        systemWater(i, mid)));
                if (g < 0) {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            return 0.5 * (lo + hi);
        }

        /** Entropy residual of a step to T at pressure pNext (that of {@link #laws}); fills {@link #trial}. */
        private double residual(double pNext, double temp) {
            double r = 0;
            double lnRatio = Math.log(temp / t);
            for (int i = 0; i < n; i++) {
                double fi = extent(i, pNext, temp);
                if (fi < 0) {
                    fi = 0;
                }
                trial[i] = fi;
                double m = 0.5 * (mass(f[i]) + mass(fi));
                double a = 0.5 * (expansion(i, f[i]) + expansion(i, fi));
                r += phi[i] * (m * (th[i].heatCapacity() * lnRatio - a * dp) + th[i].entropyOfFusion() * (fi - f[i]));
            }
            return r;
        }

        /** Advances T and the melt fractions from pNow to pNext (trial holds the new fractions). */
        private void step(double pNow, double pNext) {
            dp = pNext - pNow;
            for (int i = 0; i < n; i++) {
                laws[i] = lith[i].meltFractionAt(pNext, water0[i]);
            }
            double num = 0;
            double cpMix = 0;
            for (int i = 0; i < n; i++) {
                double m = mass(f[i]);
                num += phi[i] * m * expansion(i, f[i]);
                cpMix += phi[i] * m * th[i].heatCapacity();
            }
            double solid = t * Math.exp(num * dp / cpMix);
            double rSolid = residual(pNext, solid);
            if (rSolid == 0) {
                t = solid;
                return;
            }
            if (slope > 0 && secant(pNext, solid, rSolid)) {
                return;
            }
            // bracket: the residual rises with T (latent heat and ln T both grow with it)
            double a = solid;
            double ra = rSolid;
            double delta = rSolid > 0 ? -2.0 : 2.0;
            double b = solid + delta;
            double rb = residual(pNext, b);
            int guard = 0;
            while (Math.signum(rb) == Math.signum(ra) && rb != 0) {
                if (++guard > 60) {
                    throw new EngineException("the melting column's entropy balance has no solution at "
                            + String.format(Locale.ROOT, "%.2f GPa", pNext * 1e-9));
                }
                a = b;
                ra = rb;
                delta *= 2;
                b = solid + delta;
                rb = residual(pNext, b);
            }
            slope = (rb - ra) / (b - a);
            t = solveBracketed(pNext, a, ra, b, rb);
            residual(pNext, t);
        }

        /**
         * Secant iterations from the solid adiabat's temperature, the first step taken with the slope
         * ∂r/∂T of the previous step: in the smooth stretches of a column it converges in three or four
         * evaluations. Gives up (false) where the residual is not smooth enough for it (an onset, cpx
         * exhaustion, a stalled residue), leaving the bracketing solver to finish the step.
         */
        private boolean secant(double pNext, double x0, double r0) {
            if (!(Math.abs(r0 / slope) < SECANT_MAX_MOVE_K)) {
                return false;
            }
            double x1 = x0 - r0 / slope;
            double r1 = residual(pNext, x1);
            for (int k = 0; k < SECANT_ITERATIONS; k++) {
                if (r1 == 0) {
                    t = x1;
                    return true;
                }
                double s = (r1 - r0) / (x1 - x0);
                if (!(s > 0)) {
                    return false;
                }
                double x2 = x1 - r1 / s;
                if (!(Math.abs(x2 - x1) < SECANT_MAX_MOVE_K)) {
                    return false;
                }
                if (Math.abs(x2 - x1) < TEMPERATURE_TOLERANCE_K) {
                    t = x1; // the last temperature evaluated: trial holds its melt fractions
                    slope = s;
                    return true;
                }
                x0 = x1;
                r0 = r1;
                x1 = x2;
                r1 = residual(pNext, x1);
            }
            return false;
        }

        /** Illinois-modified regula falsi on a bracket [a, b] with f(a)·f(b) ≤ 0. */
        private double solveBracketed(double pNext, double a, double fa, double b, double fb) {
            if (fb == 0) {
                return b;
            }
            int side = 0;
            double c = b;
            double previous = Double.NaN;
            for (int k = 0; k < MAX_ITERATIONS; k++) {
                c = (a * fb - b * fa) / (fb - fa);
                if (!(c > Math.min(a, b) && c < Math.max(a, b))) {
                    c = 0.5 * (a + b);
                }
                if (Math.abs(c - previous) < TEMPERATURE_TOLERANCE_K) {
                    return c;
                }
                previous = c;
                double fc = residual(pNext, c);
                if (fc == 0 || Math.abs(b - a) < TEMPERATURE_TOLERANCE_K) {
                    return c;
                }
                if (Math.signum(fc) == Math.signum(fb)) {
                    b = c;
                    fb = fc;
                    if (side == -1) {
                        fa *= 0.5;
                    }
                    side = -1;
                } else {
                    a = c;
                    fa = fc;
                    if (side == 1) {
                        fb *= 0.5;
                    }
                    side = 1;
                }
                if (Math.abs(b - a) < TEMPERATURE_TOLERANCE_K) {
                    return (a * fb - b * fa) / (fb - fa);
                }
            }
            return c;
        }

        private ProfilePoint point(double z, double p, double productivity) {
            double fBulk = 0;
            List<Double> fs = new ArrayList<>(n);
            for (int i = 0; i < n; i++) {
                fBulk += phi[i] * f[i];
                fs.add(f[i]);
            }
            double xm = meltWater(0, p, f[0]);
            double residue = water0[0] > 0 && f[0] > 0 ? partition[0] * xm : systemWater(0, f[0]);
            return new ProfilePoint(z, p, t, fBulk, productivity + 0.0, xm, residue, fs);
        }

        private ProfilePoint withProductivity(ProfilePoint q, double productivity) {
            return new ProfilePoint(q.depth(), q.pressure(), q.temperature(), q.meltFraction(), productivity + 0.0,
                    q.waterInMelt(), q.residueWater(), q.meltFractions());
        }
    }
}
