package org.echotrellis.fit.volume;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.io.VoxelStatus;

/**
 * The maps of one {@link VolumeAnalysis} run: one float map per name of
 * {@link VolumeAnalysis#mapNames()}, the status map, for a spectrum the amplitudes per T2 bin, and
 * the run's figures. Writes them as NIfTI files on the input's grid with intent codes and a
 * {@code descrip} naming map and unit. Accessors copy.
 */
public final class VolumeMaps {
    /** Name of the 4-D spectrum file of a {@link VolumeAnalysis.Kind#SPECTRUM} run. */
    public static final String SPECTRUM_FILE = "spectrum.nii.gz";
    /** Name of the status map file. */
    public static final String STATUS_FILE = "status.nii.gz";

    private final VolumeAnalysis analysis;
    private final VolumeResult result;
    private final double noiseSigma;

    VolumeMaps(VolumeAnalysis analysis, VolumeResult result, double noiseSigma) {
        this.analysis = analysis;
        this.result = result;
        this.noiseSigma = noiseSigma;
    }

    /** @return the analysis that made these maps */
    public VolumeAnalysis analysis() {
        return analysis;
    }

    /** @return the pipeline result (every output including spectrum bins, status, timing) */
    public VolumeResult result() {
        return result;
    }

    /** @return the 3-D float32 header on the input's grid */
    public NiftiHeader mapHeader() {
        return result.mapHeader();
    }

    /** @return the scalar map names (as {@link VolumeAnalysis#mapNames()}) */
    public List<String> mapNames() {
        return analysis.mapNames();
    }

    /**
     * @param name a name of {@link #mapNames()}
     * @return a copy of the map (NaN outside the mask and where not fitted)
     */
    public float[] map(String name) {
        return result.map(name);
    }

    /** @return a copy of the status codes ({@link VoxelStatus#code()}) per voxel */
    public byte[] status() {
        return result.status();
    }

    /** @return the noise σ used by the fit (estimated or given), NaN for none */
    public double noiseSigma() {
        return noiseSigma;
    }

    /**
     * The spectrum amplitudes, one 3-D volume per T2 bin of the grid, volumes one after another
     * (the layout of {@link #SPECTRUM_FILE}).
     *
     * @return the amplitudes, empty for a fit
     */
    public Optional<float[]> spectrum() {
        if (analysis.kind() != VolumeAnalysis.Kind.SPECTRUM) {
            return Optional.empty();
        }
        double[] t2 = analysis.spectrumOptions().orElseThrow().grid().t2Ms();
        int nvox = result.status().length;
        float[] s = new float[nvox * t2.length];
        for (int j = 0; j < t2.length; j++) {
            System.arraycopy(result.map(SpectrumNames.binOutput(j, t2[j])), 0, s, j * nvox, nvox);
        }
        return Optional.of(s);
    }

    /**
     * The files {@link #write} creates, in order: one {@code NAME.nii.gz} per map name, the status
     * map and (spectrum) the 4-D spectrum.
     *
     * @return file names
     */
    public List<String> fileNames() {
        return fileNames(analysis);
    }

    /**
     * @param analysis an analysis
     * @return the files a run of it writes (see {@link #fileNames()}), known before the run
     */
    public static List<String> fileNames(VolumeAnalysis analysis) {
        List<String> f = new ArrayList<>();
        for (String n : analysis.mapNames()) {
            f.add(n + ".nii.gz");
        }
        f.add(STATUS_FILE);
        if (analysis.kind() == VolumeAnalysis.Kind.SPECTRUM) {
            f.add(SPECTRUM_FILE);
        }
        return f;
    }

    /**
     * A map with its voxels outside the mask set to a fill value.
     *
     * @param name a map name
     * @param outsideMask value outside the mask (NaN, or 0 for tools that dislike NaN)
     * @return the values
     */
    public float[] filled(String name, float outsideMask) {
        return fill(result.map(name), outsideMask, 1);
    }

    private float[] fill(float[] values, float outsideMask, int volumes) {
        if (Float.isNaN(outsideMask)) {
            return values;
        }
        byte[] status = result.status();
        int outside = VoxelStatus.OUTSIDE_MASK.code();
        for (int t = 0; t < volumes; t++) {
            for (int i = 0; i < status.length; i++) {
                if (status[i] == outside) {
                    values[t * status.length + i] = outsideMask;
                }
            }
        }
        return values;
    }

    /**
     * Writes {@link #fileNames()} into a directory, each atomically; maps carry intent
     * NIFTI_INTENT_ESTIMATE, the status map NIFTI_INTENT_LABEL, and {@code descrip} names the map and
     * its unit.
     *
     * @param dir output directory (created if needed)
     * @param outsideMask value written outside the mask (NaN by default, 0 allowed)
     * @param force overwrite existing files
     * @return the files written
     */
    public List<Path> write(Path dir, float outsideMask, boolean force) {
        List<Path> files = new ArrayList<>();
        for (String name : fileNames()) {
            Path f = dir.resolve(name);
            AtomicFiles.write(f, force, out -> writeFile(name, out, outsideMask));
            files.add(f);
        }
        return files;
    }

    /**
     * Writes one file of {@link #fileNames()} to a stream (for example a file of a distributed
     * file system), gzip-compressed, exactly as {@link #write} stores it.
     *
     * @param fileName one of {@link #fileNames()}
     * @param out the target (flushed, not closed)
     * @param outsideMask value written outside the mask (NaN by default, 0 allowed)
     * @throws IOException if the stream fails
     */
    public void writeFile(String fileName, OutputStream out, float outsideMask) throws IOException {
        NiftiHeader h = result.mapHeader();
        if (fileName.equals(STATUS_FILE)) {
            byte[] status = result.status();
            float[] codes = new float[status.length];
            for (int i = 0; i < codes.length; i++) {
                codes[i] = status[i];
            }
            Nifti.write(out, statusHeader(h), codes, true);
        } else if (fileName.equals(SPECTRUM_FILE) && analysis.kind() == VolumeAnalysis.Kind.SPECTRUM) {
            int bins = analysis.spectrumOptions().orElseThrow().grid().bins();
            Nifti.write(out, estimateHeader(h.withVolumes(bins), "T2 spectrum", "amplitude per T2 bin"),
                    fill(spectrum().orElseThrow(), outsideMask, bins), true);
        } else {
            String name = fileName.endsWith(".nii.gz") ? fileName.substring(0, fileName.length() - 7) : fileName;
            if (!mapNames().contains(name)) {
                throw new IllegalArgumentException("no file " + fileName + "; have " + fileNames());
            }
            Nifti.write(out, estimateHeader(h, name, MapUnits.unit(name)), filled(name, outsideMask), true);
        }
    }

    /**
     * @param h a map header
     * @param what the map
     * @param unit its unit
     * @return the header with NIFTI_INTENT_ESTIMATE and descrip "WHAT (UNIT)"
     */
    public static NiftiHeader estimateHeader(NiftiHeader h, String what, String unit) {
        return h.withIntent(NiftiHeader.INTENT_ESTIMATE, "estimate").withDescription(what + " (" + unit + ")");
    }

    /**
     * @param h a map header
     * @return the uint8 header of a status map with NIFTI_INTENT_LABEL
     */
    public static NiftiHeader statusHeader(NiftiHeader h) {
        return h.withDatatype(NiftiDatatype.UINT8).withIntent(NiftiHeader.INTENT_LABEL, "status")
                .withDescription("status (0 outside,1 ok,2 bound,3 low signal,4 invalid,5 not converged)");
    }
}
