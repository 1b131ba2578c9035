package org.echotrellis.cohort;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;

import com.fasterxml.jackson.databind.JsonNode;
import org.echotrellis.InputException;
import org.echotrellis.fit.volume.BidsDerivatives;
import org.echotrellis.io.Json;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.ProgressReporter;
import org.echotrellis.io.RegionStatistics;
import org.echotrellis.io.VoxelStatus;
import org.echotrellis.io.bids.BidsImages;
import org.echotrellis.io.bids.BidsLayout;
import org.echotrellis.io.bids.BidsProtocol;
import org.echotrellis.io.bids.MeseCollection;

/**
 * The analyses of one subject/session on its executor: the unit's multi-echo collections
 * ({@link BidsLayout}), their protocols ({@link BidsProtocol}), the fit and/or spectrum with the
 * derivatives written by {@link BidsDerivatives} into the task's scratch directory, and the written
 * maps summarised per label.
 */
final class UnitAnalyses {
    /** Status map of the fit and of the spectrum, by the map suffixes they qualify. */
    private static final String FIT_STATUS = "_desc-fitstatus_dseg";
    private static final String SPECTRUM_STATUS = "_desc-spectrumstatus_dseg";

    private UnitAnalyses() { }

    /**
     * The dataset as a local directory: the dataset itself when it is local, else a copy of the unit's
     * directory and of the sidecars above it in {@code stage}.
     *
     * @param request the cohort request
     * @param unit the subject/session
     * @param stage a local scratch directory for copies
     * @return the local dataset root
     */
    static Path localDataset(CohortRequest request, SubjectUnit unit, Path stage) throws IOException {
        org.apache.hadoop.fs.Path root = Storage.path(request.bidsDir());
        if (Storage.isLocal(root)) {
            return Storage.local(root);
        }
        Path sub = Files.createDirectories(stage.resolve("sub-" + unit.subject()));
        Storage.fetchSidecars(root, stage);
        org.apache.hadoop.fs.Path subDir = new org.apache.hadoop.fs.Path(root, "sub-" + unit.subject());
        if (unit.session().isEmpty()) {
            Storage.fetch(subDir, stage);
        } else {
            Storage.fetchSidecars(subDir, sub);
            Storage.fetch(new org.apache.hadoop.fs.Path(subDir, "ses-" + unit.session()), sub);
        }
        for (String pattern : new String[] {request.labels(), request.mask()}) {
            if (pattern == null || pattern.equals(BidsImages.DSEG) || pattern.equals(BidsImages.MASK)) {
                continue;  // keywords name files in the unit's own anat/ folder, fetched above
            }
            String rel = BidsImages.expand(pattern, unit.subject(), unit.session());
            org.apache.hadoop.fs.Path l = new org.apache.hadoop.fs.Path(root, rel);
            if (Storage.exists(l)) {
                Storage.fetch(l, Files.createDirectories(stage.resolve(rel).getParent()));
            }
        }
        return stage;
    }

    /**
     * Runs every collection of the unit.
     *
     * @param request the cohort request
     * @param unit the subject/session
     * @param root the local dataset root
     * @param out the local derivatives root
     * @param stage the current stage, updated for failure reports
     * @param rows receives the table rows
     * @return voxels processed (inside the mask, summed over analyses)
     */
    static long process(CohortRequest request, SubjectUnit unit, Path root, Path out, String[] stage,
            List<CohortRow> rows) {
        List<MeseCollection> cs = BidsLayout.find(root, List.of(unit.subject()),
                unit.session().isEmpty() ? List.of() : List.of(unit.session())).stream()
                .filter(c -> c.session().orElse("").equals(unit.session())).toList();
        if (cs.isEmpty()) {
            throw new InputException(root.resolve(unit.relativeDir()).resolve("anat")
                    + ": no " + unit.prefix() + "*_echo-<n>_MESE.nii[.gz] files");
        }
        BidsDerivatives.Settings settings = new BidsDerivatives.Settings(Optional.ofNullable(request.fit()),
                Optional.ofNullable(request.spectrum()), Optional.empty(), 1.0, Optional.ofNullable(request.mask()),
                request.outsideMask(), request.threadsPerTask(), false, request.commandLine());
        long voxels = 0;
        for (MeseCollection c : cs) {
            stage[0] = "read";
            BidsProtocol.Resolved p = BidsProtocol.resolve(c, Optional.ofNullable(request.protocol()),
                    OptionalDouble.empty(), "refocusing flip");
            stage[0] = "analysis";
            List<Path> files = BidsDerivatives.run(root, c, p.protocol(), p.acquisition(), settings, out,
                    ProgressReporter.NONE);
            stage[0] = "labels";
            Optional<Path> labelFile = BidsImages.find(request.labels(), BidsImages.DSEG, root, c);
            float[] labels = labelFile.map(UnitAnalyses::floats).orElse(null);
            String labelSource = labelFile.map(Path::toString).orElse("");
            for (String status : List.of(FIT_STATUS, SPECTRUM_STATUS)) {
                Path sf = out.resolve(c.relativeDir()).resolve(c.prefix() + status + ".nii.gz");
                if (!files.contains(sf)) {
                    continue;
                }
                byte[] codes = Nifti.read(sf).bytes();
                for (byte b : codes) {
                    voxels += b != VoxelStatus.OUTSIDE_MASK.code() ? 1 : 0;
                }
                for (Path f : files) {
                    String name = f.getFileName().toString();
                    if (!name.endsWith(".nii.gz") || name.endsWith("_dseg.nii.gz")
                            || (name.endsWith("_MWFmap.nii.gz") != status.equals(SPECTRUM_STATUS))) {
                        continue;
                    }
                    String stem = name.substring(0, name.length() - ".nii.gz".length());
                    String map = stem.substring(c.prefix().length() + 1);
                    String units = units(f.resolveSibling(stem + ".json"));
                    float[] v = floats(f);
                    for (RegionStatistics s : RegionStatistics.perRegion(v, codes, labels, labelSource)) {
                        rows.add(new CohortRow(unit.subject(), unit.session(), c.entities().getOrDefault("acq", ""),
                                c.entities().getOrDefault("run", ""), map, units, s));
                    }
                }
            }
        }
        return voxels;
    }

    private static String units(Path sidecar) {
        try {
            JsonNode n = Json.MAPPER.readTree(sidecar.toFile());
            return n.path("Units").asText("");
        } catch (IOException e) {
            throw new InputException(sidecar + ": cannot read (" + e.getMessage() + ")", e);
        }
    }

    private static float[] floats(Path file) {
        NiftiImage img = Nifti.read(file);
        if (img.header().volumes() != 1) {
            throw new InputException(file + ": " + img.header().volumes() + " volumes; a 3-D image is expected");
        }
        return img.floats();
    }

    /**
     * Writes {@code dataset_description.json} of the derivatives dataset ({@link BidsDerivatives})
     * if it does not exist.
     *
     * @param out the output directory
     * @param commandLine the command line
     */
    static void describe(org.apache.hadoop.fs.Path out, String commandLine) {
        org.apache.hadoop.fs.Path f = new org.apache.hadoop.fs.Path(out, "dataset_description.json");
        if (Storage.exists(f)) {
            return;
        }
        Path tmp = null;
        try {
            tmp = Files.createTempDirectory("echotrellis-cohort-");
            String text = Files.readString(BidsDerivatives.writeDescription(tmp, commandLine, false));
            Storage.writeText(f, text);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException("cannot write " + f + ": " + e.getMessage(), e);
        } finally {
            Storage.deleteLocal(tmp);
        }
    }
}
