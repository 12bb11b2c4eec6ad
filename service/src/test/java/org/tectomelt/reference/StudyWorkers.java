package org.tectomelt.reference;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import org.tectomelt.studies.Workers;

/** Two threads for the reference tests' studies, on one daemon pool shared by the test JVM. */
final class StudyWorkers {

    private static final ExecutorService POOL = Executors.newFixedThreadPool(1, r -> {
        Thread t = new Thread(r, "study-reference-test");
        t.setDaemon(true);
        return t;
    });

    private StudyWorkers() {
    }

    /** The calling thread and one helper. */
    static Workers two() {
        return Workers.on(POOL, 2);
    }
}
