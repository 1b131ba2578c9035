package org.echotrellis.cohort;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

import org.echotrellis.InputException;
import org.echotrellis.fit.volume.VolumeMaps;
import org.echotrellis.fit.volume.VolumeRequest;
import org.echotrellis.io.EchoSeries;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.ProgressReporter;
import org.echotrellis.io.VolumeJob;
import org.echotrellis.sequence.ProtocolText;

/**
 * The analyses of one subject/session on its executor: every multi-echo collection is joined into a
 * 4-D series in the task's scratch directory (one echo volume in memory at a time), run through the
 * requested analyses with the unit's mask when present, and written as derivatives; the written maps
 * are summarised per label.
 */
final class UnitAnalyses {
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
        Files.createDirectories(stage);
        org.apache.hadoop.fs.Path dir = root;
        Path local = stage;
        for (String part : ("sub-" + unit.subject() + (unit.session().isEmpty() ? "" : "/ses-" + unit.session()))
                .split("/")) {
            Storage.fetchSidecars(dir, local);
            dir = new org.apache.hadoop.fs.Path(dir, part);
            local = local.resolve(part);
            Files.createDirectories(local);
        }
        Storage.fetch(new org.apache.hadoop.fs.Path(dir, "anat"), local);
        if (request.labels() != null && !request.labels().equals(LabelImages.DSEG)) {
            String rel = request.labels().replace("{sub}", unit.subject()).replace("{ses}", unit.session());
            org.apache.hadoop.fs.Path l = new org.apache.hadoop.fs.Path(root, rel);
            if (Storage.exists(l)) {
                Path into = stage.resolve(rel).getParent();
                Files.createDirectories(into);
                Storage.fetch(l, into);
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
     * @return voxels processed
     */
    static long process(CohortRequest request, SubjectUnit unit, Path root, Path out, String[] stage,
            List<CohortRow> rows) throws IOException {
        Path anatOut = Files.createDirectories(out.resolve(unit.relativeDir()).resolve("anat"));
        long voxels = 0;
        for (MeseCollection c : MeseCollection.find(root, unit)) {
            stage[0] = "read";
            ProtocolText protocol = SidecarProtocol.of(c, request.protocol());
            Path series = out.getParent().resolve(c.entities() + "_series.nii");
            NiftiHeader grid = EchoSeries.join(c.echoFiles(), series);
            List<String> sources = new ArrayList<>();
            for (Path f : c.echoFiles()) {
                sources.add("bids:raw:" + root.relativize(f).toString().replace('\\', '/'));
            }
            Optional<NiftiImage> mask = LabelImages.beside(root, unit, c.entities(), "mask").map(p -> onGrid(p, grid));
            stage[0] = "labels";
            float[] labels = LabelImages.find(request.labels(), root, unit, c.entities())
                    .map(p -> floats(onGrid(p, grid))).orElse(null);
            List<VolumeRequest> requests = new ArrayList<>();
            if (request.fit() != null) {
                requests.add(VolumeRequest.fit(protocol, request.fit()));
            }
            if (request.spectrum() != null) {
                requests.add(VolumeRequest.spectrum(protocol, request.spectrum()));
            }
            for (VolumeRequest r : requests) {
                stage[0] = r.kind().name().toLowerCase(java.util.Locale.ROOT);
                VolumeMaps maps;
                try (NiftiInput in = Nifti.open(series)) {
                    VolumeJob job = new VolumeJob(in, mask, Optional.empty(), request.threadsPerTask(),
                            request.slabValues());
                    maps = SubjectTask.analysis(r).run(job, ProgressReporter.NONE);
                }
                voxels += maps.result().processed();
                stage[0] = "write";
                rows.addAll(Derivatives.write(anatOut, c, unit, maps, labels, sources));
            }
            Files.deleteIfExists(series);
        }
        return voxels;
    }

    private static NiftiImage onGrid(Path file, NiftiHeader grid) {
        NiftiImage img = Nifti.read(file);
        NiftiHeader h = img.header();
        if (h.volumes() != 1 || h.size(1) != grid.size(1) || h.size(2) != grid.size(2) || h.size(3) != grid.size(3)) {
            throw new InputException(file + ": shape " + h.size(1) + "x" + h.size(2) + "x" + h.size(3) + "x" + h.volumes()
                    + " is not the 3-D grid " + grid.size(1) + "x" + grid.size(2) + "x" + grid.size(3) + " of the series");
        }
        return img;
    }

    private static float[] floats(NiftiImage img) {
        float[] f = new float[img.size()];
        for (int i = 0; i < f.length; i++) {
            f[i] = (float) img.get(i);
        }
        return f;
    }
}
