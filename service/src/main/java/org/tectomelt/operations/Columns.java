package org.tectomelt.operations;

import java.util.ArrayList;
import java.util.List;
import org.tectomelt.engine.column.ColumnResult;
import org.tectomelt.engine.column.ColumnState;
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

    /** One profile point. */
    public record Point(double depthKm, double pressureGPa, double temperatureC, double meltFraction,
                        double productivityPercentPerGPa, double waterInMeltWtPct) {
    }

    /** The column inside a setting's result; absent quantities are explicit nulls. */
    public record Column(String upwelling, double lidDepthKm, @ExplicitNull Onset onset, @ExplicitNull Top top,
                         double maxMeltFraction, double meanMeltFraction, double meltThicknessKm,
                         double crustalThicknessKm, @ExplicitNull Double meanMeltingPressureGPa,
                         List<Point> profile) {
    }

    /** The column in API units. */
    static Column column(ColumnResult r) {
        Onset onset = r.onset().map(Columns::onset).orElse(null);
        Top top = r.top().map(Columns::top).orElse(null);
        List<Point> profile = new ArrayList<>(r.profile().size());
        for (ProfilePoint p : r.profile()) {
            profile.add(new Point(Units.mToKm(p.depth()), Units.paToGpa(p.pressure()),
                    Units.kelvinToCelsius(p.temperature()), p.meltFraction(),
                    Units.perPaToPercentPerGpa(p.productivity()), Units.fractionToWtPct(p.waterInMelt())));
        }
        Double meanP = r.meanMeltingPressure().isPresent()
                ? Units.paToGpa(r.meanMeltingPressure().getAsDouble()) : null;
        return new Column(r.upwelling() == Upwelling.ACTIVE ? "active" : "passive", Units.mToKm(r.lidDepth()), onset,
                top, r.maxMeltFraction(), r.meanMeltFraction(), Units.mToKm(r.meltThickness()),
                Units.mToKm(r.crustalThickness()), meanP, profile);
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
                        r -> column.apply(r).meanMeltingPressureGPa()));
    }

    private static Onset onset(ColumnState s) {
        return new Onset(Units.mToKm(s.depth()), Units.paToGpa(s.pressure()), Units.kelvinToCelsius(s.temperature()));
    }

    private static Top top(ColumnState s) {
        return new Top(Units.mToKm(s.depth()), Units.paToGpa(s.pressure()), Units.kelvinToCelsius(s.temperature()),
                s.meltFraction());
    }
}
