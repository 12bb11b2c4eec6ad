package org.tectomelt.engine.composition;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.tectomelt.engine.ModelInfo;

/**
 * The catalogue of tabulated trace-element data, read once from the classpath
 * ({@code /composition/*.csv}): partition-coefficient sets, mantle sources and normalising
 * reservoirs. Each file carries a header naming its source, its units and which values are recalled
 * rather than read: lines {@code # id: …} and {@code # model: id | citation | doi}, then a CSV body
 * whose first line names the columns.
 */
public final class CompositionTables {

    private static final String DIR = "/composition/";
    private static final Map<String, PartitionCoefficients> PARTITION = new LinkedHashMap<>();
    private static final Map<String, ElementAbundances> SOURCES = new LinkedHashMap<>();
    private static final Map<String, ElementAbundances> NORMALISATIONS = new LinkedHashMap<>();

    static {
        PartitionCoefficients d = readPartition("partition-coefficients-peridotite.csv");
        PARTITION.put(d.id(), d);
        for (String f : List.of("source-dmm-workman-hart2005.csv", "source-primitive-mantle-mcdonough-sun1995.csv")) {
            ElementAbundances a = readAbundances(f);
            SOURCES.put(a.id(), a);
        }
        for (String f : List.of("normalisation-ci-chondrite-sun-mcdonough1989.csv",
                "normalisation-primitive-mantle-sun-mcdonough1989.csv")) {
            ElementAbundances a = readAbundances(f);
            NORMALISATIONS.put(a.id(), a);
        }
    }

    private CompositionTables() {
    }

    /** Ids of the partition-coefficient sets, default first. */
    public static List<String> partitionCoefficientIds() {
        return List.copyOf(PARTITION.keySet());
    }

    /** Ids of the source compositions, default first. */
    public static List<String> sourceIds() {
        return List.copyOf(SOURCES.keySet());
    }

    /** Ids of the normalising reservoirs, default first. */
    public static List<String> normalisationIds() {
        return List.copyOf(NORMALISATIONS.keySet());
    }

    /** The partition-coefficient set with this id. */
    public static Optional<PartitionCoefficients> partitionCoefficients(String id) {
        return Optional.ofNullable(PARTITION.get(id));
    }

    /** The source composition with this id. */
    public static Optional<ElementAbundances> source(String id) {
        return Optional.ofNullable(SOURCES.get(id));
    }

    /** The normalising reservoir with this id. */
    public static Optional<ElementAbundances> normalisation(String id) {
        return Optional.ofNullable(NORMALISATIONS.get(id));
    }

    /** The default partition coefficients (the peridotite compilation). */
    public static PartitionCoefficients defaultPartitionCoefficients() {
        return PARTITION.values().iterator().next();
    }

    /** The default source (depleted MORB mantle, Workman &amp; Hart 2005). */
    public static ElementAbundances defaultSource() {
        return SOURCES.values().iterator().next();
    }

    /** The default normalisation (CI chondrite, Sun &amp; McDonough 1989). */
    public static ElementAbundances defaultNormalisation() {
        return NORMALISATIONS.values().iterator().next();
    }

    private record Table(String id, List<ModelInfo> models, List<String> columns, List<String[]> rows) {
    }

    private static Table read(String file) {
        try (InputStream in = CompositionTables.class.getResourceAsStream(DIR + file)) {
            if (in == null) {
                throw new IllegalStateException("missing resource " + DIR + file);
            }
            BufferedReader r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            String id = null;
            List<ModelInfo> models = new ArrayList<>();
            List<String> columns = null;
            List<String[]> rows = new ArrayList<>();
            for (String line = r.readLine(); line != null; line = r.readLine()) {
                if (line.isBlank()) {
                    continue;
                }
                if (line.startsWith("#")) {
                    String h = line.substring(1).trim();
                    if (h.startsWith("id:")) {
                        id = h.substring(3).trim();
                    } else if (h.startsWith("model:")) {
                        String[] p = h.substring(6).split("\\|");
                        models.add(new ModelInfo(p[0].trim(), p[1].trim(), p.length > 2 ? p[2].trim() : ""));
                    }
                    continue;
                }
                String[] cells = line.split(",", -1);
                if (columns == null) {
                    columns = List.of(cells);
                } else {
                    rows.add(cells);
                }
            }
            if (id == null || models.isEmpty() || columns == null) {
                throw new IllegalStateException(file + ": header needs '# id:', '# model:' and a column line");
            }
            return new Table(id, models, columns, rows);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static Element element(String file, String symbol) {
        return Element.bySymbol(symbol.trim())
                .orElseThrow(() -> new IllegalStateException(file + ": unknown element " + symbol));
    }

    static PartitionCoefficients readPartition(String file) {
        Table t = read(file);
        int[] col = new int[Mineral.COUNT];
        for (Mineral m : Mineral.values()) {
            col[m.ordinal()] = t.columns().indexOf(m.id());
            if (col[m.ordinal()] < 0) {
                throw new IllegalStateException(file + ": no column " + m.id());
            }
        }
        int prov = t.columns().indexOf("provenance");
        Map<Element, double[]> rows = new EnumMap<>(Element.class);
        Map<Element, String> provenance = new EnumMap<>(Element.class);
        for (String[] c : t.rows()) {
            Element e = element(file, c[0]);
            double[] k = new double[Mineral.COUNT];
            for (int i = 0; i < k.length; i++) {
                k[i] = Double.parseDouble(c[col[i]].trim());
            }
            rows.put(e, k);
            if (prov >= 0) {
                provenance.put(e, c[prov].trim());
            }
        }
        return new PartitionCoefficients(t.id(), t.models(), rows, provenance);
    }

    static ElementAbundances readAbundances(String file) {
        Table t = read(file);
        int ppm = t.columns().indexOf("ppm");
        if (ppm < 0) {
            throw new IllegalStateException(file + ": no column ppm");
        }
        Map<Element, Double> values = new EnumMap<>(Element.class);
        for (String[] c : t.rows()) {
            values.put(element(file, c[0]), Double.parseDouble(c[ppm].trim()));
        }
        return new ElementAbundances(t.id(), t.models(), values);
    }
}
