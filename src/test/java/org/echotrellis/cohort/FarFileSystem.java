package org.echotrellis.cohort;

import java.net.URI;

import org.apache.hadoop.fs.RawLocalFileSystem;

/**
 * The local disk under a scheme of its own, {@code farfs:///path}: for the cohort job it is a
 * remote file system like {@code hdfs://} or {@code s3a://} (not {@code file:}), so a test drives
 * the remote branch — units copied to the executor's scratch directory, outputs published through
 * the Hadoop {@code FileSystem} API — without a cluster. Registered for Hadoop's service loader in
 * {@code src/test/resources/META-INF/services/org.apache.hadoop.fs.FileSystem}.
 */
public class FarFileSystem extends RawLocalFileSystem {
    /** The scheme. */
    public static final String SCHEME = "farfs";
    private static final URI ROOT = URI.create(SCHEME + ":///");

    @Override
    public String getScheme() {
        return SCHEME;
    }

    @Override
    public URI getUri() {
        return ROOT;
    }
}
