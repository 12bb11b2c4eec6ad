package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.DeferredList;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.ColumnState;
import org.tectomelt.engine.column.LithologyMelting;
import org.tectomelt.engine.column.ProfilePoint;
import org.tectomelt.engine.column.Upwelling;
import org.tectomelt.engine.units.Units;

/** A decompression column in API units, as the column and every setting built on it report it. */
public final class Columns {

    private Columns() {
    }

    /** Where melting begins. */
    public record Onset(double depthKm, double pressureGPa, double temperatureC) {
    }

    /** Where melting stops. */
    public record Top(double depthKm, double pressureGPa, double temperatureC, double meltFraction) {
    }

    /**
     * One profile point; {@code pyroxeniteMeltFraction} is the pyroxenite's own extent of melting
     * (null for a peridotite-only source), {@code meltFraction} the source's mass-weighted one.
     */
    public record Point(double depthKm, double pressureGPa, double temperatureC, double meltFraction,
                        double productivityPercentPerGPa, double waterInMeltWtPct, double residueWaterWtPct,
                        @ExplicitNull Double pyroxeniteMeltFraction) {
    }

    /** How one lithology of the source melted. */
    public record LithologyShare(String lithology, double massFraction, @ExplicitNull Onset onset,
                                 double maxMeltFraction, double topMeltFraction, double meltShare) {
    }

    /** The column inside a setting's result; absent quantities are explicit nulls. */
    public record Column(String upwelling, double lidDepthKm, @ExplicitNull Onset onset, @ExplicitNull Top top,
                         double maxMeltFraction, double meanMeltFraction, double meltThicknessKm,
                         double crustalThicknessKm, @ExplicitNull Double meanMeltingPressureGPa,
                         String meltingMode, @ExplicitNull Double pyroxeniteMeltShare,
                         List<LithologyShare> lithologies, List<Point> profile) {
    }

    /** The column in API units. */
    static Column column(ColumnResult r) {
        Onset onset = r.onset().map(Columns::onset).orElse(null);
        Top top = r.top().map(Columns::top).orElse(null);
        boolean mixed = r.lithologies().size() > 1;
        // the rows are converted when read (an answer reads them, a run's point does not)
        List<Point> profile = DeferredList.of(() -> profile(r.profile(), mixed));
        List<LithologyShare> shares = new ArrayList<>(r.lithologies().size());
        for (LithologyMelting l : r.lithologies()) {
            shares.add(new LithologyShare(l.lithology().id(), l.massFraction(), l.onset().map(Columns::onset)
                    .orElse(null), l.maxMeltFraction(), l.topMeltFraction(), l.meltShare()));
        }
        Double meanP = r.meanMeltingPressure().isPresent()
                ? Units.paToGpa(r.meanMeltingPressure().getAsDouble()) : null;
        return new Column(r.upwelling() == Upwelling.ACTIVE ? "active" : "passive", Units.mToKm(r.lidDepth()), onset,
                top, r.maxMeltFraction(), r.meanMeltFraction(), Units.mToKm(r.meltThickness()),
                Units.mToKm(r.crustalThickness()), meanP, r.mode().apiName(),
                mixed ? r.lithologies().get(1).meltShare() : null, shares, profile);
    }

    private static List<Point> profile(List<ProfilePoint> points, boolean mixed) {
        List<Point> profile = new ArrayList<>(points.size());
        for (ProfilePoint p : points) {
            profile.add(new Point(Units.mToKm(p.depth()), Units.paToGpa(p.pressure()),
                    Units.kelvinToCelsius(p.temperature()), p.meltFraction(),
                    Units.perPaToPercentPerGpa(p.productivity()), Units.fractionToWtPct(p.waterInMelt()),
                    Units.fractionToWtPct(p.residueWater()), mixed ? p.meltFractions().get(1) : null));
        }
        return profile;
    }

    /** Outputs every column offers, read through {@code column} from a result. */
    static <R> List<Output<R>> outputs(String prefix, java.util.function.Function<R, Column> column) {
        String p = prefix.isEmpty() ? "" : prefix + ".";
        return List.of(
                new Output<>(p + "onset.depthKm", "km", "depth where melting begins",
                        r -> column.apply(r).onset() == null ? null : column.apply(r).onset().depthKm()),
                new Output<>(p + "top.depthKm", "km", "depth where melting stops",
                        r -> column.apply(r).top() == null ? null : column.apply(r).top().depthKm()),
                new Output<>(p + "maxMeltFraction", "1", "largest melt fraction in the column",
                        r -> column.apply(r).maxMeltFraction()),
                new Output<>(p + "meanMeltFraction", "1", "mean melt fraction of the column",
                        r -> column.apply(r).meanMeltFraction()),
                new Output<>(p + "meltThicknessKm", "km", "melt thickness (∫F dz)",
                        r -> column.apply(r).meltThicknessKm()),
                new Output<>(p + "meanMeltingPressureGPa", "GPa", "mean pressure of melting",
                        r -> column.apply(r).meanMeltingPressureGPa()),
                new Output<>(p + "pyroxeniteMeltShare", "1", "share of the melt made by the pyroxenite",
                        r -> column.apply(r).pyroxeniteMeltShare()));
    }

    private static Onset onset(ColumnState s) {
        return new Onset(Units.mToKm(s.depth()), Units.paToGpa(s.pressure()), Units.kelvinToCelsius(s.temperature()));
    }

    private static Top top(ColumnState s) {
        return new Top(Units.mToKm(s.depth()), Units.paToGpa(s.pressure()), Units.kelvinToCelsius(s.temperature()),
                s.meltFraction());
    }
}
