package org.tectomelt.engine.crust;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.engine.EngineException;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.MeltCurve;

/**
 * Energy balance per unit area between a crystallising intrusion and the crust it heats
 * (REFERENCES.md §3.3):
 * <pre>
 *   heat released per m³ of intrusion   qb = ρb [cb (Tb0 − Tf) + Xb Lb]
 *   heat required per m³ of crust       qc = ρc [cc (Tf − Tc0) + F Lc]
 *   thickness ratio                     hb / hc = qc / qb
 * </pre>
 * where Tb0 is the emplacement temperature, Tf the common final temperature, Xb the fraction of the
 * intrusion that crystallises, Tc0 the crust's initial temperature and F the melt fraction the
 * crust reaches at Tf.
 *
 * <p>The balance assumes every joule the intrusion gives up goes into the chosen crustal layer: no
 * heat is conducted away to the surface, to rock beyond the layer or into melt that leaves. Real
 * intrusions lose much of their heat that way, so the intrusion thickness it gives is a
 * <b>lower bound</b> (and the crust thickness an upper bound). It is the reasoning of, for example,
 * Huppert &amp; Sparks (1988); the transient {@link SillModel} accounts for the losses.
 *
 * <p>Two ways to set the target: a final temperature, with the crust's melt fraction from its melt
 * curve (or given explicitly), or a melt fraction, whose temperature is then read off the melt curve.
 * Unless given, Xb is what the intrusion's own melt curve crystallises between Tb0 and Tf,
 * F(Tb0) − F(Tf), or 1 when it has no melt curve.
 *
 * @param intrusion the intrusion (its temperature is the emplacement temperature)
 * @param crust     the crust (its temperature is the initial temperature)
 */
public record HeatBudget(Layer intrusion, Layer crust) {

    /** Provenance of the balance. */
    public static final ModelInfo INFO = new ModelInfo("heat-budget-no-loss",
            "Energy balance of a crystallising intrusion and the crust it heats, without losses; e.g. Huppert, H.E. & "
                    + "Sparks, R.S.J. (1988) The generation of granitic magmas by intrusion of basalt into continental "
                    + "crust. Journal of Petrology 29, 599-624",
            "10.1093/petrology/29.3.599");

    /** Validates the layers. */
    public HeatBudget {
        if (intrusion == null || crust == null) {
            throw new EngineException("a heat budget needs an intrusion and a crust");
        }
    }

    /**
     * Properties of one layer.
     *
     * @param density      density (kg/m³)
     * @param heatCapacity specific heat (J/kg/K)
     * @param latentHeat   latent heat of melting (J/kg)
     * @param temperature  starting temperature (K): emplacement for the intrusion, initial for the crust
     * @param meltCurve    melt fraction F(T), or {@code null} when none is known
     */
    public record Layer(double density, double heatCapacity, double latentHeat, double temperature,
                        MeltCurve meltCurve) {

        /** Validates the properties. */
        public Layer {
            if (!(density > 0) || !(heatCapacity > 0) || !(latentHeat >= 0) || !(temperature > 0)
                    || !Double.isFinite(density + heatCapacity + latentHeat + temperature)) {
                throw new EngineException("a layer needs positive density, heat capacity and temperature and a "
                        + "latent heat of at least 0");
            }
        }
    }

    /**
     * The balance at a final temperature.
     *
     * @param finalTemperature     Tf (K), between the crust's initial and the intrusion's temperature
     * @param crustMeltFraction    F reached by the crust, or {@code null} to read it from the crust's melt curve
     * @param crystallizedFraction Xb, or {@code null} for the default (see the class comment)
     * @throws EngineException when Tf lies outside that range, F cannot be found, or no heat is needed
     */
    public Result atFinalTemperature(double finalTemperature, Double crustMeltFraction, Double crystallizedFraction) {
        List<String> warnings = new ArrayList<>();
        if (!(finalTemperature >= crust.temperature() && finalTemperature <= intrusion.temperature())) {
            throw new EngineException(String.format(Locale.ROOT, "the final temperature must lie between the crust's "
                    + "initial temperature (%.2f K) and the intrusion's temperature (%.2f K)", crust.temperature(),
                    intrusion.temperature()));
        }
        double f;
        if (crustMeltFraction != null) {
            f = crustMeltFraction;
            if (crust.meltCurve() != null) {
                double onCurve = crust.meltCurve().fractionAt(finalTemperature);
                if (Math.abs(onCurve - f) > 0.01) {
                    warnings.add(String.format(Locale.ROOT, "the crust's melt curve gives melt fraction %.3f at the "
                            + "final temperature, not the %.3f given", onCurve, f));
                }
            }
        } else if (crust.meltCurve() != null) {
            f = crust.meltCurve().fractionAt(finalTemperature);
        } else {
            throw new EngineException("the crust's melt fraction at the final temperature needs a melt curve or an "
                    + "explicit target melt fraction");
        }
        if (crust.meltCurve() != null && crust.meltCurve().fractionAt(crust.temperature()) > 0) {
            warnings.add("the crust already holds melt at its initial temperature: its latent heat is counted in full");
        }
        return result(finalTemperature, f, crystallizedFraction, warnings);
    }

    /**
     * The balance for a crustal melt fraction, the final temperature being where the crust's melt
     * curve first reaches it (its solidus for F = 0).
     *
     * @param crustMeltFraction    target F, between 0 and the curve's largest melt fraction
     * @param crystallizedFraction Xb, or {@code null} for the default
     * @throws EngineException when the crust has no melt curve, the curve never reaches F, or the final
     *                         temperature lies outside the crust's initial and the intrusion's temperature
     */
    public Result atCrustMeltFraction(double crustMeltFraction, Double crystallizedFraction) {
        MeltCurve curve = crust.meltCurve();
        if (curve == null) {
            throw new EngineException("a target melt fraction alone needs the crust's melt curve to find the final "
                    + "temperature");
        }
        if (!(crustMeltFraction >= 0 && crustMeltFraction <= curve.maxFraction())) {
            throw new EngineException(String.format(Locale.ROOT, "the crust's melt curve reaches melt fractions from 0 "
                    + "to %.3f, not %.3f", curve.maxFraction(), crustMeltFraction));
        }
        double tf = crustMeltFraction <= 0 ? curve.solidus() : curve.temperatureAt(crustMeltFraction);
        return atFinalTemperature(tf, crustMeltFraction, crystallizedFraction);
    }

    private Result result(double tf, double f, Double crystallizedFraction, List<String> warnings) {
        MeltCurve own = intrusion.meltCurve();
        double implied = own == null ? 1.0
                : Math.max(0.0, own.fractionAt(intrusion.temperature()) - own.fractionAt(tf));
        double xb;
        if (crystallizedFraction == null) {
            xb = implied;
        } else {
            xb = crystallizedFraction;
            if (own != null && xb > implied + 0.01) {
                warnings.add(String.format(Locale.ROOT, "the intrusion's melt curve crystallises only %.3f between its "
                        + "emplacement and the final temperature: a crystallized fraction of %.3f overstates the latent "
                        + "heat released", implied, xb));
            }
        }
        double released = intrusion.density()
                * (intrusion.heatCapacity() * (intrusion.temperature() - tf) + xb * intrusion.latentHeat());
        double required = crust.density() * (crust.heatCapacity() * (tf - crust.temperature()) + f * crust.latentHeat());
        if (!(released > 0)) {
            throw new EngineException("the intrusion releases no heat: its temperature equals the final temperature "
                    + "and nothing crystallises");
        }
        if (!(required > 0)) {
            throw new EngineException("the crust needs no heat: the final temperature equals its initial temperature "
                    + "and nothing melts");
        }
        return new Result(tf, f, xb, released, required, warnings);
    }

    /**
     * The balance. Heats per cubic metre of each rock; the thickness methods turn them into per-area
     * statements.
     *
     * @param finalTemperature     Tf (K)
     * @param crustMeltFraction    F reached by the crust
     * @param crystallizedFraction Xb used
     * @param heatReleased         qb (J/m³ of intrusion)
     * @param heatRequired         qc (J/m³ of crust)
     * @param warnings             notes for the caller
     */
    public record Result(double finalTemperature, double crustMeltFraction, double crystallizedFraction,
                         double heatReleased, double heatRequired, List<String> warnings) {

        /** Defensive copy. */
        public Result {
            warnings = List.copyOf(warnings);
        }

        /** hb / hc = qc / qb: metres of intrusion per metre of crust brought to the target (a lower bound). */
        public double thicknessRatio() {
            return heatRequired / heatReleased;
        }

        /** Crust thickness (m) an intrusion of {@code intrusionThickness} (m) can bring to the target (an upper bound). */
        public double crustThicknessFor(double intrusionThickness) {
            return intrusionThickness * heatReleased / heatRequired;
        }

        /** Intrusion thickness (m) needed for a crust of {@code crustThickness} (m) (a lower bound). */
        public double intrusionThicknessFor(double crustThickness) {
            return crustThickness * heatRequired / heatReleased;
        }
    }
}
