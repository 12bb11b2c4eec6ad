package org.tectomelt.engine;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.tectomelt.engine.column.DecompressionColumn;
import org.tectomelt.engine.column.SourceColumn;
import org.tectomelt.engine.composition.ColumnComposition;
import org.tectomelt.engine.composition.MantleMineralogy;
import org.tectomelt.engine.composition.Shaw1970;
import org.tectomelt.engine.composition.Zou1998DynamicMelting;
import org.tectomelt.engine.crust.HeatBudget;
import org.tectomelt.engine.crust.Miao2014Conductivity;
import org.tectomelt.engine.crust.SillModel;
import org.tectomelt.engine.melting.CrustalLithology;
import org.tectomelt.engine.melting.HuangWyllie1973Granite;
import org.tectomelt.engine.melting.Katz2003Peridotite;
import org.tectomelt.engine.melting.McKenzieBickle1988Peridotite;
import org.tectomelt.engine.melting.PertermannHirschmann2003Pyroxenite;
import org.tectomelt.engine.melting.WaterSaturatedPeridotiteSolidus;
import org.tectomelt.engine.settings.ContinentalRift;
import org.tectomelt.engine.settings.Hotspot;
import org.tectomelt.engine.settings.SlowSpreadingConductiveLid;
import org.tectomelt.engine.thermal.ContinentalGeotherm;
import org.tectomelt.engine.thermal.HalfSpaceCooling;
import org.tectomelt.engine.thermal.LithostaticColumn;
import org.tectomelt.engine.thermal.MantleAdiabat;
import org.tectomelt.engine.thermal.PlateCooling;
import org.tectomelt.engine.thermal.PlateParameters;

/**
 * Every published model (and stated common practice) the engine can cite, once each: the list
 * behind {@code GET /v1/citations}. A test finds every {@code ModelInfo} constant of the engine by
 * reading its classes, so a new model cannot be left out of this list.
 */
public final class ModelCatalogue {

    private ModelCatalogue() {
    }

    /** Every model, by id, in a stable order (first occurrence of an id wins). */
    public static List<ModelInfo> all() {
        Map<String, ModelInfo> byId = new LinkedHashMap<>();
        for (ModelInfo m : List.of(
                // thermal structure
                LithostaticColumn.INFO, HalfSpaceCooling.INFO, PlateCooling.INFO, PlateParameters.GDH1.source(),
                PlateParameters.PS77.source(), ContinentalGeotherm.INFO, MantleAdiabat.INFO,
                // melting laws
                Katz2003Peridotite.INFO, Katz2003Peridotite.EXPERIMENTAL_WET_INFO, McKenzieBickle1988Peridotite.INFO,
                PertermannHirschmann2003Pyroxenite.INFO, WaterSaturatedPeridotiteSolidus.INFO, HuangWyllie1973Granite.INFO,
                CrustalLithology.METAPELITE_INFO, CrustalLithology.AMPHIBOLITE_INFO,
                CrustalLithology.AMPHIBOLITE_WOLF_WYLLIE_INFO, CrustalLithology.BASALT_INFO,
                // columns and settings
                DecompressionColumn.INFO, DecompressionColumn.PASSIVE_REGIME_INFO,
                DecompressionColumn.MEAN_PRESSURE_INFO, SourceColumn.TWO_LITHOLOGY_INFO, SourceColumn.FRACTIONAL_INFO,
                SourceColumn.WATER_EXTRACTION_INFO, SlowSpreadingConductiveLid.INFO, Hotspot.LID_EFFECT_INFO,
                ContinentalRift.INFO,
                ContinentalRift.RIFT_MELTING_INFO,
                // trace elements
                Shaw1970.INFO, Zou1998DynamicMelting.INFO, ColumnComposition.INFO,
                MantleMineralogy.WORKMAN_HART_2005_MODE, MantleMineralogy.JOHNSON_1990_REACTION,
                MantleMineralogy.WALTER_1998_REACTION, MantleMineralogy.ROBINSON_WOOD_1998,
                MantleMineralogy.KLEMME_ONEILL_2000,
                // crust
                HeatBudget.INFO, Miao2014Conductivity.INFO, SillModel.ANNEN_SPARKS_2002, SillModel.ENTHALPY_METHOD,
                SillModel.HUPPERT_SPARKS_1988)) {
            byId.putIfAbsent(m.id(), m);
        }
        return List.copyOf(new ArrayList<>(byId.values()));
    }
}
