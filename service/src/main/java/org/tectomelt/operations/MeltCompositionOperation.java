package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.tectomelt.engine.Deadline;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.composition.ColumnComposition;
import org.tectomelt.engine.composition.CompositionResult;
import org.tectomelt.engine.composition.CompositionTables;
import org.tectomelt.engine.composition.Element;
import org.tectomelt.engine.composition.ElementAbundances;
import org.tectomelt.engine.composition.MantleMineralogy;
import org.tectomelt.engine.column.MeltingMode;
import org.tectomelt.engine.composition.Mineral;
import org.tectomelt.engine.composition.NormalisedRatio;
import org.tectomelt.engine.composition.PartitionCoefficients;
import org.tectomelt.engine.melting.MantleLithology;
import org.tectomelt.engine.settings.ContinentalRift;
import org.tectomelt.engine.settings.Hotspot;
import org.tectomelt.engine.settings.MidOceanRidge;
import org.tectomelt.engine.units.Units;

/**
 * {@code melt-composition}: trace elements in the melts and residues of a decompression column or a
 * setting (ridge, hotspot, rift) — along the column and pooled — for batch, fractional or
 * near-fractional melting, with cited or caller-supplied source concentrations and partition
 * coefficients. Heavy (it runs a column, which may be fine-stepped).
 */
public final class MeltCompositionOperation
        implements Operation<MeltCompositionOperation.Request, MeltCompositionOperation.Result> {

    /** Mineral/melt partition coefficients of one element, one per mineral. */
    public record MineralCoefficients(Double olivine, Double orthopyroxene, Double clinopyroxene, Double garnet,
                                      Double spinel) {
        double[] values() {
            return new double[] {olivine, orthopyroxene, clinopyroxene, garnet, spinel};
        }
    }

    /** Request: exactly one of the four melting regimes plus the composition choices (the spec fills defaults). */
    public record Request(DecompressionOperation.Request column, MidOceanRidgeOperation.Request midOceanRidge,
                          HotspotOperation.Request hotspot, ContinentalRiftOperation.Request continentalRift, List<String> elements, String source,
                          Map<String, Double> sourceConcentrationsPpm, String partitionCoefficients,
                          Map<String, MineralCoefficients> userPartitionCoefficients, Double partitionCoefficientScale,
                          String meltingMode, Double retainedMeltFraction, String normalisation) {
    }

    /** Normalised ratios; null when an element of the ratio was not asked for. */
    public record Ratios(@ExplicitNull Double laSmN, @ExplicitNull Double smYbN, @ExplicitNull Double dyYbN,
                         @ExplicitNull Double laYbN) {
    }

    /** The pooled melt and residue of the regime. */
    public record Pooled(String regime, double meanMeltFraction, Map<String, Double> meltPpm,
                         Map<String, Double> meltNormalised, Map<String, Double> residuePpm, Ratios ratios) {
    }

    /** One point along the column. */
    public record Point(double depthKm, double pressureGPa, double meltFraction, double garnetFraction,
                        double cpxInResidue, Map<String, Double> instantaneousPpm,
                        Map<String, Double> instantaneousNormalised, Map<String, Double> accumulatedPpm,
                        Map<String, Double> residuePpm) {
    }

    /** A data table used, with its sources. */
    public record Table(String kind, String id, List<ModelInfo> models, List<String> suppliedElements) {
    }

    /** The result. */
    public record Result(String regime, String meltingMode, double retainedMeltFraction, List<String> elements,
                         Map<String, Double> sourcePpm, Map<String, Double> normalisationPpm, @ExplicitNull Pooled pooled, List<Point> profile,
                         Columns.Column column, List<Table> tables, List<String> warnings, List<String> assumptions,
                         List<ModelInfo> models) {
    }

    private static final List<String> REGIMES = List.of("column", "midOceanRidge", "hotspot", "continentalRift");

    @Override
    public String name() {
        return "melt-composition";
    }

    @Override
    public String path() {
        return "/v1/melt-composition";
    }

    @Override
    public Class<Request> requestType() {
        return Request.class;
    }

    @Override
    public Cost costClass() {
        return Cost.HEAVY;
    }

    @Override
    public String rows() {
        return "profile";
    }

    @Override
    public List<Input> inputs() {
        List<Input> in = new ArrayList<>(List.of(
                new Input("column.potentialTemperatureC", "°C", "potential temperature of the column", true),
                new Input("column.lidDepthKm", "km", "lid base of the column", true),
                new Input("midOceanRidge.potentialTemperatureC", "°C", "ridge mantle potential temperature", true),
                new Input("hotspot.potentialTemperatureC", "°C", "plume potential temperature", true),
                new Input("hotspot.lithosphereThicknessKm", "km", "lid over the plume", true),
                new Input("continentalRift.potentialTemperatureC", "°C", "rift mantle potential temperature", true),
                new Input("continentalRift.stretchingFactor", "1", "rift stretching factor β", true),
                new Input("partitionCoefficientScale", "1", "factor on every partition coefficient", true),
                new Input("retainedMeltFraction", "1", "melt kept in the residue (near-fractional)", true)));
        for (Element e : Element.values()) {
            in.add(new Input("sourceConcentrationsPpm." + e.symbol(), "ppm", "source concentration of " + e.symbol(),
                    true));
        }
        return List.copyOf(in);
    }

    @Override
    public List<Output<Result>> outputs() {
        List<Output<Result>> out = new ArrayList<>();
        out.add(new Output<>("pooled.meanMeltFraction", "1", "mean melt fraction of the pooled regime",
                r -> r.pooled() == null ? null : r.pooled().meanMeltFraction()));
        out.add(new Output<>("pooled.ratios.laSmN", "1", "(La/Sm)N of the pooled melt",
                r -> r.pooled() == null ? null : r.pooled().ratios().laSmN()));
        out.add(new Output<>("pooled.ratios.smYbN", "1", "(Sm/Yb)N of the pooled melt",
                r -> r.pooled() == null ? null : r.pooled().ratios().smYbN()));
        out.add(new Output<>("pooled.ratios.dyYbN", "1", "(Dy/Yb)N of the pooled melt",
                r -> r.pooled() == null ? null : r.pooled().ratios().dyYbN()));
        out.add(new Output<>("pooled.ratios.laYbN", "1", "(La/Yb)N of the pooled melt",
                r -> r.pooled() == null ? null : r.pooled().ratios().laYbN()));
        for (Element e : Element.values()) {
            String s = e.symbol();
            out.add(new Output<>("pooled.meltPpm." + s, "ppm", s + " in the pooled melt",
                    r -> r.pooled() == null ? null : r.pooled().meltPpm().get(s)));
        }
        return List.copyOf(out);
    }

    /** What the chosen regime ran: its column, how its melts pool, its models, assumptions, warnings. */
    private record Regime(String name, ColumnResult column, boolean passive, double poolingDepth,
                          List<ModelInfo> models, List<String> assumptions, List<String> warnings) {
    }

    @Override
    public Result run(Request q, Deadline deadline) {
        Rules rules = new Rules();
        List<String> given = new ArrayList<>();
        if (q.column() != null) {
            given.add("column");
        }
        if (q.midOceanRidge() != null) {
            given.add("midOceanRidge");
        }
        if (q.hotspot() != null) {
            given.add("hotspot");
        }
        if (q.continentalRift() != null) {
            given.add("continentalRift");
        }
        if (given.size() != 1) {
            String field = given.isEmpty() ? "column" : given.get(1);
            rules.error(field, "give exactly one of " + REGIMES + " (the melting regime), got "
                    + (given.isEmpty() ? "none" : given));
        }
        List<Element> elements = elements(rules, q.elements());
        ElementAbundances source = CompositionTables.source(q.source()).orElse(null);
        if (source == null) {
            rules.error("source", "must be one of " + CompositionTables.sourceIds() + ", got '"
                    + Choices.abbreviate(q.source()) + "'");
        }
        PartitionCoefficients d = CompositionTables.partitionCoefficients(q.partitionCoefficients()).orElse(null);
        if (d == null) {
            rules.error("partitionCoefficients", "must be one of " + CompositionTables.partitionCoefficientIds()
                    + ", got '" + Choices.abbreviate(q.partitionCoefficients()) + "'");
        }
        ElementAbundances norm = CompositionTables.normalisation(q.normalisation()).orElse(null);
        if (norm == null) {
            rules.error("normalisation", "must be one of " + CompositionTables.normalisationIds() + ", got '"
                    + Choices.abbreviate(q.normalisation()) + "'");
        }
        Map<Element, Double> userSource = userSource(rules, q.sourceConcentrationsPpm());
        Map<Element, double[]> userD = userCoefficients(rules, q.userPartitionCoefficients());
        MeltingMode mode = switch (q.meltingMode()) {
            case "batch" -> MeltingMode.BATCH;
            case "near-fractional" -> MeltingMode.NEAR_FRACTIONAL;
            default -> MeltingMode.FRACTIONAL;
        };
        Regime regime = given.size() == 1 ? regime(rules, q, given.get(0)) : null;
        rules.throwIfBroken();

        ElementAbundances src = source.withValues(userSource);
        PartitionCoefficients coefficients = d.withRows(userD).scaled(q.partitionCoefficientScale());
        ColumnComposition model = new ColumnComposition(elements, src, coefficients, MantleMineralogy.DEFAULT, mode,
                q.retainedMeltFraction());
        CompositionResult c = model.along(regime.column());

        List<String> warnings = new ArrayList<>(regime.warnings());
        Pooled pooled = null;
        if (c.size() >= 2 && c.meltFraction(c.size() - 1) > 0) {
            CompositionResult.Pooled p = regime.passive() ? c.pooledPassive(regime.poolingDepth()) : c.pooledActive();
            double[] melt = new double[elements.size()];
            double[] res = new double[elements.size()];
            for (int j = 0; j < melt.length; j++) {
                melt[j] = p.melt(j);
                res[j] = p.residue(j);
            }
            pooled = new Pooled(regime.passive() ? "passive" : "active", p.meanMeltFraction(), byElement(elements, melt),
                    normalised(elements, melt, norm), byElement(elements, res), ratios(elements, melt, norm));
        } else {
            warnings.add("no melt is made, so there is no melt composition: the profile is empty and pooled is null");
        }
        List<Point> profile = new ArrayList<>(c.size());
        double[] inst = new double[elements.size()];
        double[] acc = new double[elements.size()];
        double[] res = new double[elements.size()];
        for (int i = 0; i < c.size(); i++) {
            for (int j = 0; j < inst.length; j++) {
                inst[j] = c.instantaneousMelt(i, j);
                acc[j] = c.accumulatedMelt(i, j);
                res[j] = c.residue(i, j);
            }
            profile.add(new Point(Units.mToKm(c.depth(i)), Units.paToGpa(c.pressure(i)), c.meltFraction(i),
                    c.garnetFraction(i), c.cpxInResidue(i), byElement(elements, inst), normalised(elements, inst, norm),
                    byElement(elements, acc), byElement(elements, res)));
        }
        Map<String, Double> sourcePpm = new LinkedHashMap<>();
        Map<String, Double> normalisationPpm = new LinkedHashMap<>();
        for (Element e : elements) {
            sourcePpm.put(e.symbol(), src.ppm(e));
            normalisationPpm.put(e.symbol(), norm.ppm(e));
        }
        List<Table> tables = List.of(
                new Table("source", source.id(), source.models(), symbols(userSource.keySet())),
                new Table("partition-coefficients", d.id(), d.models(), symbols(userD.keySet())),
                new Table("normalisation", norm.id(), norm.models(), List.of()));
        Set<ModelInfo> models = new LinkedHashSet<>(model.models());
        models.addAll(norm.models());
        models.addAll(regime.models());
        List<String> assumptions = new ArrayList<>(model.assumptions());
        if (q.partitionCoefficientScale() != 1.0) {
            assumptions.add("every partition coefficient multiplied by " + Rules.format(q.partitionCoefficientScale()));
        }
        assumptions.add(regime.passive()
                ? "pooled as a passive (triangular) regime: each level's accumulated melt weighted by its melt fraction "
                        + "(Plank & Langmuir 1992)" + (Double.isFinite(regime.poolingDepth())
                        ? ", levels above the unstretched lithosphere base only" : "")
                : "pooled as an active column: the accumulated melt at the top of the column");
        assumptions.addAll(regime.assumptions());
        return new Result(regime.name(), q.meltingMode(), mode == MeltingMode.NEAR_FRACTIONAL
                ? q.retainedMeltFraction() : (mode == MeltingMode.BATCH ? 1.0 : 0.0), symbols(elements), sourcePpm,
                normalisationPpm, pooled, profile, Columns.column(regime.column()), tables, warnings, assumptions, List.copyOf(models));
    }

    private static List<String> symbols(java.util.Collection<Element> elements) {
        return elements.stream().map(Element::symbol).toList();
    }

    private static List<Element> elements(Rules rules, List<String> symbols) {
        List<Element> out = new ArrayList<>();
        for (int i = 0; i < symbols.size(); i++) {
            String s = symbols.get(i);
            Element e = s == null ? null : Element.bySymbol(s).orElse(null);
            if (e == null) {
                rules.error("elements[" + i + "]", "must be one of " + symbols(Element.all()) + ", got '"
                        + Choices.abbreviate(s) + "'");
            } else if (out.contains(e)) {
                rules.error("elements[" + i + "]", "'" + s + "' is listed twice");
            } else {
                out.add(e);
            }
        }
        return out;
    }

    private static Map<Element, Double> userSource(Rules rules, Map<String, Double> given) {
        Map<Element, Double> out = new EnumMap<>(Element.class);
        if (given == null) {
            return out;
        }
        given.forEach((s, v) -> {
            Element e = Element.bySymbol(s).orElse(null);
            if (e == null) {
                rules.error("sourceConcentrationsPpm." + s, "is not an element the service models " + symbols(
                        Element.all()));
            } else if (v == null || !Double.isFinite(v) || !(v > 0)) {
                rules.error("sourceConcentrationsPpm." + s, "must be a finite positive concentration, got " + v);
            } else {
                out.put(e, v);
            }
        });
        return out;
    }

    private static Map<Element, double[]> userCoefficients(Rules rules, Map<String, MineralCoefficients> given) {
        Map<Element, double[]> out = new EnumMap<>(Element.class);
        if (given == null) {
            return out;
        }
        given.forEach((s, k) -> {
            Element e = Element.bySymbol(s).orElse(null);
            String field = "userPartitionCoefficients." + s;
            if (e == null) {
                rules.error(field, "is not an element the service models " + symbols(Element.all()));
                return;
            }
            if (k == null) {
                rules.error(field, "needs a coefficient for every mineral " + minerals());
                return;
            }
            Double[] v = {k.olivine(), k.orthopyroxene(), k.clinopyroxene(), k.garnet(), k.spinel()};
            boolean ok = true;
            for (Mineral m : Mineral.values()) {
                Double x = v[m.ordinal()];
                if (x == null || !Double.isFinite(x) || !(x > 0)) {
                    rules.error(field + "." + m.id(), x == null
                            ? "is required: a supplied element needs a coefficient for every mineral " + minerals()
                            : "must be a finite positive partition coefficient, got " + x);
                    ok = false;
                }
            }
            if (ok) {
                out.put(e, k.values());
            }
        });
        return out;
    }

    private static List<String> minerals() {
        return java.util.Arrays.stream(Mineral.values()).map(Mineral::id).toList();
    }

    private static Regime regime(Rules rules, Request q, String which) {
        switch (which) {
            case "column" -> {
                DecompressionOperation.Request s = q.column();
                Rules at = rules.at("column");
                MantleLithology lith = Choices.mantleLithology(at, s.lithology());
                double water = Choices.mantleWater(at, lith, s.bulkWaterWtPct());
                if (!rules.ok()) {
                    return null;
                }
                ColumnResult r = DecompressionColumn.of(lith, Units.celsiusToKelvin(s.potentialTemperatureC()), water)
                        .withLidDepth(Units.kmToM(s.lidDepthKm()))
                        .withUpwelling("active".equals(s.upwelling()) ? Upwelling.ACTIVE : Upwelling.PASSIVE)
                        .withOutputStep(Units.kmToM(s.stepKm())).solve();
                return new Regime("column", r, r.upwelling() == Upwelling.PASSIVE, Double.POSITIVE_INFINITY,
                        r.models(), r.assumptions(), r.warnings());
            }
            case "midOceanRidge" -> {
                MidOceanRidgeOperation.Request s = q.midOceanRidge();
                Rules at = rules.at("midOceanRidge");
                MantleLithology lith = Choices.mantleLithology(at, s.lithology());
                double water = Choices.mantleWater(at, lith, s.bulkWaterWtPct());
                if (!rules.ok()) {
                    return null;
                }
                MidOceanRidge.Result r = new MidOceanRidge(lith, Units.celsiusToKelvin(s.potentialTemperatureC()), water,
                        Units.mmPerYrToMPerS(s.fullSpreadingRateMmPerYr())).solve();
                return new Regime("midOceanRidge", r.column(), true, Double.POSITIVE_INFINITY, r.models(),
                        r.assumptions(), r.warnings());
            }
            case "hotspot" -> {
                HotspotOperation.Request s = q.hotspot();
                Rules at = rules.at("hotspot");
                MantleLithology lith = Choices.mantleLithology(at, s.lithology());
                double water = Choices.mantleWater(at, lith, s.bulkWaterWtPct());
                if (!rules.ok()) {
                    return null;
                }
                Hotspot.Result r = new Hotspot(lith, Units.celsiusToKelvin(s.potentialTemperatureC()),
                        Units.celsiusToKelvin(s.ambientPotentialTemperatureC()), Units.kmToM(s.lithosphereThicknessKm()),
                        Units.kmToM(s.plumeRadiusKm()), Units.cmPerYrToMPerS(s.upwellingVelocityCmPerYr()), water)
                        .solve();
                return new Regime("hotspot", r.column(), false, Double.POSITIVE_INFINITY, r.models(), r.assumptions(),
                        r.warnings());
            }
            default -> {
                ContinentalRiftOperation.Request s = q.continentalRift();
                Rules at = rules.at("continentalRift");
                MantleLithology lith = Choices.mantleLithology(at, s.lithology());
                double water = Choices.mantleWater(at, lith, s.bulkWaterWtPct());
                at.check(s.crustThicknessKm() < s.lithosphereThicknessKm(), "crustThicknessKm",
                        "must be less than lithosphereThicknessKm (" + Rules.format(s.lithosphereThicknessKm())
                                + " km), got " + Rules.format(s.crustThicknessKm()));
                if (!rules.ok()) {
                    return null;
                }
                ContinentalRift.Result r = new ContinentalRift(lith, Units.celsiusToKelvin(s.potentialTemperatureC()),
                        s.stretchingFactor(), Units.kmToM(s.lithosphereThicknessKm()), Units.kmToM(s.crustThicknessKm()),
                        water).solve();
                return new Regime("continentalRift", r.column(), true, Units.kmToM(s.lithosphereThicknessKm()),
                        r.models(), r.assumptions(), r.warnings());
            }
        }
    }

    private static Map<String, Double> byElement(List<Element> elements, double[] v) {
        Map<String, Double> m = new LinkedHashMap<>();
        for (int j = 0; j < v.length; j++) {
            m.put(elements.get(j).symbol(), v[j]);
        }
        return m;
    }

    private static Map<String, Double> normalised(List<Element> elements, double[] v, ElementAbundances norm) {
        Map<String, Double> m = new LinkedHashMap<>();
        for (int j = 0; j < v.length; j++) {
            m.put(elements.get(j).symbol(), v[j] / norm.ppm(elements.get(j)));
        }
        return m;
    }

    private static Ratios ratios(List<Element> elements, double[] melt, ElementAbundances norm) {
        Double[] r = new Double[NormalisedRatio.values().length];
        for (NormalisedRatio ratio : NormalisedRatio.values()) {
            int a = elements.indexOf(ratio.numerator());
            int b = elements.indexOf(ratio.denominator());
            if (a >= 0 && b >= 0) {
                java.util.OptionalDouble v = ratio.of(melt[a], melt[b], norm);
                r[ratio.ordinal()] = v.isPresent() ? v.getAsDouble() : null;
            }
        }
        return new Ratios(r[0], r[1], r[2], r[3]);
    }
}
