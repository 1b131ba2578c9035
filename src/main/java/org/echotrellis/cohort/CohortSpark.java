package org.echotrellis.cohort;

import org.apache.spark.SparkConf;
import org.apache.spark.sql.SparkSession;

/**
 * The Spark session of a cohort run. Under {@code spark-submit} the master and the rest of the
 * configuration come from the submission; run embedded (plain {@code java}), the job runs in local
 * mode on all cores ({@code local[*]}) unless {@code --master} says otherwise. A session that is
 * already active in the JVM (a notebook, a test) is reused and left running.
 */
public final class CohortSpark implements AutoCloseable {
    private final SparkSession session;
    private final boolean owned;

    private CohortSpark(SparkSession session, boolean owned) {
        this.session = session;
        this.owned = owned;
    }

    /**
     * Gets the active session or starts one.
     *
     * @param master a Spark master URL ({@code local[4]}, {@code spark://host:7077}, {@code yarn}), or
     *        null for the submission's master, else {@code local[*]}
     * @return the session holder; close it to stop a session it started
     */
    public static CohortSpark open(String master) {
        SparkSession active = SparkSession.getDefaultSession().getOrElse(() -> null);
        if (active != null) {
            return new CohortSpark(active, false);
        }
        // Netty (Spark's transport) reads this once; spark-submit passes it as a JVM flag
        System.setProperty("io.netty.tryReflectionSetAccessible", "true");
        SparkConf conf = new SparkConf(true);
        if (master != null) {
            conf.setMaster(master);
        } else if (!conf.contains("spark.master")) {
            conf.setMaster("local[*]");
        }
        conf.setIfMissing("spark.app.name", "echotrellis cohort");
        if (conf.get("spark.master").startsWith("local")) {
            // embedded run: no web UI port, no network name lookups, few shuffle partitions
            conf.setIfMissing("spark.ui.enabled", "false");
            conf.setIfMissing("spark.driver.host", "127.0.0.1");
            conf.setIfMissing("spark.driver.bindAddress", "127.0.0.1");
            conf.setIfMissing("spark.sql.shuffle.partitions", "4");
        }
        SparkSession s = SparkSession.builder().config(conf).getOrCreate();
        s.sparkContext().setLogLevel("WARN");
        return new CohortSpark(s, true);
    }

    /** @return the session */
    public SparkSession session() {
        return session;
    }

    /** Stops the session if this holder started it. */
    @Override
    public void close() {
        if (owned) {
            session.stop();
        }
    }
}
