package org.echotrellis.cohort;

import org.apache.spark.sql.SparkSession;

/**
 * One local Spark session ({@code local[2]}, no UI, two shuffle partitions) shared by all cohort
 * tests of the JVM; started on first use, stopped when the JVM exits.
 */
final class SharedSpark {
    private static SparkSession session;

    private SharedSpark() { }

    static synchronized SparkSession get() {
        if (session == null) {
            System.setProperty("io.netty.tryReflectionSetAccessible", "true");
            session = SparkSession.builder().master("local[2]").appName("echotrellis-tests")
                    .config("spark.ui.enabled", "false")
                    .config("spark.driver.host", "127.0.0.1")
                    .config("spark.driver.bindAddress", "127.0.0.1")
                    .config("spark.sql.shuffle.partitions", "2")
                    .getOrCreate();
            session.sparkContext().setLogLevel("ERROR");
            Runtime.getRuntime().addShutdownHook(new Thread(session::stop));
        }
        return session;
    }
}
