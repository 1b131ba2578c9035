package org.echotrellis.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;

/**
 * The outcome of a volume job: one float map per kernel output, the status map, and timing.
 * Accessors copy.
 */
public final class VolumeResult {
    private final NiftiHeader mapHeader;
    private final List<String> names;
    private final float[][] maps;
    private final byte[] status;
    private final double seconds;
    private final long processed;

    VolumeResult(NiftiHeader mapHeader, List<String> names, float[][] maps, byte[] status, double seconds,
            long processed) {
        this.mapHeader = mapHeader;
        this.names = List.copyOf(names);
        this.maps = maps;
        this.status = status;
        this.seconds = seconds;
        this.processed = processed;
    }

    /** @return the 3-D float32 header on the data grid (geometry of the input) */
    public NiftiHeader mapHeader() {
        return mapHeader;
    }

    /** @return the map names */
    public List<String> names() {
        return names;
    }

    /**
     * @param name an output name
     * @return a copy of that map (NaN where not fitted)
     */
    public float[] map(String name) {
        int i = names.indexOf(name);
        if (i < 0) {
            throw new IllegalArgumentException("no map " + name + "; have " + names);
        }
        return maps[i].clone();
    }

    /** @return a copy of the status codes ({@link VoxelStatus#code()}) */
    public byte[] status() {
        return status.clone();
    }

    /** @return voxels per status */
    public Map<VoxelStatus, Long> statusCounts() {
        Map<VoxelStatus, Long> m = new EnumMap<>(VoxelStatus.class);
        for (VoxelStatus s : VoxelStatus.values()) {
            m.put(s, 0L);
        }
        for (byte b : status) {
            VoxelStatus s = VoxelStatus.ofCode(b);
            m.put(s, m.get(s) + 1);
        }
        return m;
    }

    /** @return wall time of the job in seconds */
    public double seconds() {
        return seconds;
    }

    /** @return voxels inside the mask */
    public long processed() {
        return processed;
    }

    /** @return voxels inside the mask per second of wall time */
    public double voxelsPerSecond() {
        return seconds > 0 ? processed / seconds : Double.NaN;
    }

    /**
     * Finite values of a map at fitted voxels ({@link VoxelStatus#fitted()}), sorted.
     *
     * @param name an output name
     * @return the sorted values
     */
    public double[] fittedValues(String name) {
        float[] m = maps[names.indexOf(name)];
        double[] v = new double[m.length];
        int n = 0;
        for (int i = 0; i < m.length; i++) {
            if (VoxelStatus.ofCode(status[i]).fitted() && Float.isFinite(m[i])) {
                v[n++] = m[i];
            }
        }
        v = Arrays.copyOf(v, n);
        Arrays.sort(v);
        return v;
    }

    /**
     * Writes every map as {@code DIR/NAME.nii.gz} (float32) and {@code DIR/status.nii.gz} (uint8).
     *
     * @param dir output directory (created if needed)
     * @param force overwrite existing files
     * @return the files written
     */
    public List<Path> writeMaps(Path dir, boolean force) {
        List<Path> files = new ArrayList<>();
        for (int i = 0; i < names.size(); i++) {
            Path f = dir.resolve(names.get(i) + ".nii.gz");
            Nifti.write(f, mapHeader, maps[i], force);
            files.add(f);
        }
        double[] codes = new double[status.length];
        for (int i = 0; i < codes.length; i++) {
            codes[i] = status[i];
        }
        Path f = dir.resolve("status.nii.gz");
        Nifti.write(f, mapHeader.withDatatype(NiftiDatatype.UINT8), codes, force);
        files.add(f);
        return files;
    }
}
