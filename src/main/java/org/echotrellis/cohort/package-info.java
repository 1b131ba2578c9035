/**
 * Cohort scale on Apache Spark: one task per subject/session of a BIDS dataset, each running the
 * volume analyses of {@code fit.volume} on its executor, writing its BIDS derivatives atomically, and
 * summarising its maps per region ({@link org.echotrellis.io.RegionStatistics}); the driver
 * gathers the cohort table (CSV and Parquet) and the failures. Files are reached through Hadoop's
 * FileSystem API ({@code file://}, {@code hdfs://}, {@code s3a://}).
 *
 * <p>Spark is a {@code provided} dependency: only this package imports {@code org.apache.spark} or
 * {@code org.apache.hadoop}, and nothing outside it loads this package unless Spark is on the class
 * path. Imports the jobs and {@code io}; never {@code cli} or {@code plot}.
 */
package org.echotrellis.cohort;
