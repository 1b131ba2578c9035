package org.echotrellis.fit.volume;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.ObjectInputStream;
import java.io.ObjectOutputStream;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;
import java.util.Optional;

import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.ProgressReporter;
import org.echotrellis.io.VoxelStatus;
import org.echotrellis.sequence.ProtocolText;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The public volume API: series from a path, a stream or a channel; serialisable requests; written maps. */
class VolumeAnalysisTest {
    private static final Path PROTOCOL = Path.of("sequences/knee-t2-16.yaml");
    private static final double[] AFFINE = {1.5, 0, 0, -20, 0, 1.5, 0, -30, 0, 0, 3, 12};

    @TempDir
    Path dir;

    /** A 5×4×2 series of noise-free EPG decays, T2 30..69 ms, B1 0.8, amplitude 100; voxel 0 outside the mask. */
    private Path series(CpmgTrain train, String name) {
        int nv = 40;
        double[] data = new double[nv * train.echoes()];
        CpmgEngine engine = new CpmgEngine(1);
        for (int v = 0; v < nv; v++) {
            double[] e = engine.echoes(train, 1000, 30 + v, 0.8);
            for (int k = 0; k < e.length; k++) {
                data[k * nv + v] = 100 * Math.abs(e[k]);
            }
        }
        Path f = dir.resolve(name);
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 5, 4, 2, train.echoes()).withAffine(AFFINE, 1), data, false);
        return f;
    }

    private Path mask() {
        double[] m = new double[40];
        java.util.Arrays.fill(m, 1);
        m[0] = 0;
        Path f = dir.resolve("mask.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.UINT8, 5, 4, 2).withAffine(AFFINE, 1), m, false);
        return f;
    }

    @Test
    void pathStreamAndChannelGiveTheSameMaps() throws IOException {
        VolumeAnalysis fit = VolumeAnalysis.fit(ProtocolText.read(PROTOCOL).parse(), FitOptions.DEFAULT);
        Path gz = series(fit.train(), "s.nii.gz");
        Path raw = series(fit.train(), "s.nii");
        Optional<NiftiImage> mask = Optional.of(Nifti.read(mask()));
        VolumeMaps fromPath = fit.run(gz, Optional.of(dir.resolve("mask.nii")), Optional.empty(), 2, ProgressReporter.NONE);
        VolumeMaps fromStream;
        try (InputStream in = Files.newInputStream(gz); NiftiInput s = Nifti.open(in, "s.nii.gz")) {
            fromStream = fit.run(s, mask, Optional.empty(), 1, ProgressReporter.NONE);
        }
        VolumeMaps fromChannel;
        try (NiftiInput s = Nifti.open(FileChannel.open(raw, StandardOpenOption.READ), "s.nii")) {
            fromChannel = fit.run(s, mask, Optional.empty(), 2, ProgressReporter.NONE);
        }
        float[] t2 = fromPath.map("t2_ms");
        assertArrayEquals(t2, fromStream.map("t2_ms"));
        assertArrayEquals(t2, fromChannel.map("t2_ms"));
        assertTrue(Float.isNaN(t2[0]));
        assertEquals(VoxelStatus.OUTSIDE_MASK.code(), fromPath.status()[0]);
        for (int v = 1; v < 40; v++) {
            // noise-free decays from the engine: the fit returns the generating T2 (round-trip check)
            assertEquals(30 + v, t2[v], (30 + v) * 1e-3, "voxel " + v);
        }
        assertEquals(List.of("t2_ms", "t2_se_ms", "b1_scale", "b1_se", "amplitude", "residual_rms"), fromPath.mapNames());
    }

    @Test
    void serialisedRequestRunsTheSameAnalysisAndWritesFilledMaps() throws Exception {
        VolumeRequest request = VolumeRequest.fit(ProtocolText.read(PROTOCOL), FitOptions.DEFAULT.withT2BoundsMs(2, 3000));
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (ObjectOutputStream out = new ObjectOutputStream(bytes)) {
            out.writeObject(request);
        }
        VolumeRequest shipped;
        try (ObjectInputStream in = new ObjectInputStream(new ByteArrayInputStream(bytes.toByteArray()))) {
            shipped = (VolumeRequest) in.readObject();
        }
        assertEquals(request, shipped);
        VolumeAnalysis a = shipped.analysis();
        Path s = series(a.train(), "s.nii.gz");
        VolumeMaps maps = a.run(s, Optional.of(mask()), Optional.empty(), 2, ProgressReporter.NONE);
        Path out = dir.resolve("maps");
        List<Path> files = maps.write(out, 0f, false);
        assertEquals(maps.fileNames().size(), files.size());
        NiftiImage t2 = Nifti.read(out.resolve("t2_ms.nii.gz"));
        assertEquals(0.0, t2.get(0));  // fill value outside the mask
        assertEquals(31, t2.get(1), 31e-3);
        assertEquals(NiftiHeader.INTENT_ESTIMATE, t2.header().intentCode());
        assertTrue(t2.header().description().contains("ms"), t2.header().description());
        assertEquals(3, t2.header().rank());
        assertEquals(0f, t2.header().pixdim(4));
        assertArrayEquals(AFFINE, t2.header().affine(), 1e-6);  // geometry copied from the series
        NiftiImage status = Nifti.read(out.resolve(VolumeMaps.STATUS_FILE));
        assertEquals(NiftiHeader.INTENT_LABEL, status.header().intentCode());
        assertFalse(out.resolve(VolumeMaps.SPECTRUM_FILE).toFile().exists());
    }

    @Test
    void spectrumWritesOneVolumePerBin() {
        SpectrumOptions o = SpectrumOptions.DEFAULT.withGrid(new org.echotrellis.fit.spectrum.T2Grid(10, 1000, 20));
        VolumeRequest request = VolumeRequest.spectrum(ProtocolText.read(PROTOCOL), o);
        VolumeAnalysis a = request.analysis();
        Path s = series(a.train(), "s.nii");
        VolumeMaps maps = a.run(s, Optional.of(mask()), Optional.empty(), 2, ProgressReporter.NONE);
        Path out = dir.resolve("spectrum");
        maps.write(out, Float.NaN, false);
        NiftiImage spectrum = Nifti.read(out.resolve(VolumeMaps.SPECTRUM_FILE));
        assertEquals(20, spectrum.header().size(4));
        assertTrue(out.resolve("fraction_10_40ms.nii.gz").toFile().isFile());
        assertEquals(maps.spectrum().orElseThrow().length, spectrum.size());
    }

    @Test
    void echoCountMismatchNamesBothFiles() {
        VolumeAnalysis a = VolumeAnalysis.fit(ProtocolText.read(PROTOCOL).parse(), FitOptions.DEFAULT);
        Path s = series(CpmgTrain.constant(8, 10, 180), "eight.nii");
        InputException e = assertThrows(InputException.class,
                () -> a.run(s, Optional.empty(), Optional.empty(), 1, ProgressReporter.NONE));
        assertTrue(e.getMessage().contains("eight.nii") && e.getMessage().contains("knee-t2-16.yaml"), e.getMessage());
        InputException bad = assertThrows(InputException.class, () -> FitOptions.DEFAULT.withT2BoundsMs(50, 10));
        assertFalse(bad.getMessage().contains("--"), bad.getMessage());
    }
}
