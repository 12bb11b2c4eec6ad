package org.tectomelt.http;

import com.github.benmanes.caffeine.cache.Cache;
import com.github.benmanes.caffeine.cache.Caffeine;

/**
 * Bounded in-memory cache of heavy results: request key ({@link RequestKey}) → the 200 answer
 * (media type and bytes). Bounded by size in bytes ({@code TECTOMELT_CACHE_MB}; 0 turns it off), evicting
 * the entries least likely to be asked for again (Caffeine's W-TinyLFU). Results are deterministic,
 * so an entry never goes stale within one build; a new build or other caps give other keys.
 */
final class ResultCache {

    /** Overhead counted per entry on top of the key and value bytes. */
    private static final int ENTRY_OVERHEAD = 96;

    private final Cache<String, Responses.Written> cache;

    /** @param megabytes bound in MiB; 0 for no cache */
    ResultCache(int megabytes) {
        this.cache = megabytes <= 0 ? null : Caffeine.newBuilder()
                .maximumWeight(megabytes * 1_048_576L)
                .weigher((String k, Responses.Written v) -> ENTRY_OVERHEAD + 2 * k.length() + v.bytes().length)
                .recordStats()
                .build();
    }

    /** True when caching is on. */
    boolean enabled() {
        return cache != null;
    }

    /** The cached answer for {@code key}, or null. */
    Responses.Written get(String key) {
        return cache == null || key == null ? null : cache.getIfPresent(key);
    }

    /** Keeps {@code answer} for {@code key} (no-op when off or when there is no key). */
    void put(String key, Responses.Written answer) {
        if (cache != null && key != null && answer != null) {
            cache.put(key, answer);
        }
    }

    /** The underlying cache for metrics, or null when off. */
    Cache<String, Responses.Written> caffeine() {
        return cache;
    }
}
