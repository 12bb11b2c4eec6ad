package org.tectomelt.http;

import io.javalin.http.Context;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.tectomelt.engine.ModelInfo;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.Lithologies;
import org.tectomelt.engine.melting.Lithology;
import org.tectomelt.engine.melting.ThermalProperties;
import org.tectomelt.engine.units.Units;

/** {@code GET /v1/lithologies}: the melting models the service offers (the catalogue, no computation). */
final class MeltingRoutes {

    private MeltingRoutes() {
    }

    static List<Route> routes() {
        return List.of(Route.get("/v1/lithologies", MeltingRoutes::lithologies));
    }

    /** Thermal properties of a crustal lithology. */
    record ThermalPropertiesOut(double densityKgPerM3, double heatCapacityJPerKgK, double latentHeatJPerKg,
                                double conductivityWPerMK) {
    }

    /** One lithology of the catalogue. */
    record LithologyOut(String id, String name, String kind, boolean hydrous, List<Double> pressureRangeGPa,
                        double maxPressureGPa, double maxBulkWaterWtPct, boolean acceptsMeltCurve,
                        ThermalPropertiesOut thermalProperties, List<ModelInfo> citations) {
    }

    static void lithologies(Context ctx) {
        List<LithologyOut> out = new ArrayList<>();
        for (Lithology l : Lithologies.all()) {
            ThermalPropertiesOut thermal = null;
            if (l instanceof CrustalLithology c) {
                ThermalProperties t = c.thermalProperties();
                thermal = new ThermalPropertiesOut(t.density(), t.heatCapacity(), t.latentHeat(), t.conductivity());
            }
            out.add(new LithologyOut(l.id(), l.name(), l.kind().name().toLowerCase(Locale.ROOT), l.hydrous(),
                    List.of(Units.paToGpa(l.minPressure()), Units.paToGpa(l.maxPressure())),
                    Units.paToGpa(l.hardMaxPressure()), Units.fractionToWtPct(l.maxBulkWater()),
                    l instanceof CrustalLithology, thermal, l.citations()));
        }
        Responses.json(ctx, out);
    }
}
