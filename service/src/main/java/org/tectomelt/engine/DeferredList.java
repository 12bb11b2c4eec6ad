package org.tectomelt.engine;

import java.util.AbstractList;
import java.util.List;
import java.util.RandomAccess;
import java.util.function.Supplier;

/**
 * An immutable list built on its first read. A result carries its text (assumptions in words)
 * and its rows (a profile in API units) this way, so that a caller reading only its scalars (a
 * run's point, a study's sample) never pays for building them, while every caller that reads them
 * (an HTTP answer, a test) sees the same elements as an eager list: the builder runs at most once,
 * its list is copied, and equality and hash are those of {@link List}.
 *
 * <p>The builder must be a pure function of immutable state (it may run on another thread, later).
 *
 * @param <T> element type
 */
public final class DeferredList<T> extends AbstractList<T> implements RandomAccess {

    private Supplier<? extends List<? extends T>> builder;
    private volatile List<T> built;

    private DeferredList(Supplier<? extends List<? extends T>> builder) {
        this.builder = builder;
    }

    /** A list whose elements {@code builder} gives when the list is first read. */
    public static <T> List<T> of(Supplier<? extends List<? extends T>> builder) {
        return new DeferredList<>(builder);
    }

    /**
     * The defensive copy a record takes of a list component: a deferred list as it is (it is
     * immutable and copies its elements when built), any other list through {@link List#copyOf}.
     */
    public static <T> List<T> copyOf(List<T> list) {
        return list instanceof DeferredList<T> ? list : List.copyOf(list);
    }

    /** True once the elements have been built (for tests). */
    public boolean isBuilt() {
        return built != null;
    }

    private List<T> elements() {
        List<T> b = built;
        if (b == null) {
            synchronized (this) {
                b = built;
                if (b == null) {
                    b = List.copyOf(builder.get());
                    built = b;
                    builder = null;
                }
            }
        }
        return b;
    }

    @Override
    public T get(int index) {
        return elements().get(index);
    }

    @Override
    public int size() {
        return elements().size();
    }
}
