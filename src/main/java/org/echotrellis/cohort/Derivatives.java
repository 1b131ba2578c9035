package org.echotrellis.cohort;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import com.fasterxml.jackson.core.JsonProcessingException;
import org.echotrellis.fit.volume.VolumeAnalysis;
import org.echotrellis.fit.volume.VolumeMaps;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.Json;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.RegionStatistics;

/**
 * Writes one analysis of one collection as BIDS derivatives in {@code anat/} and summarises the
 * written values per region. Fit: {@code _T2map} in seconds, {@code _M0map} (signal units),
 * {@code _desc-fittedflip_TB1map} (the fitted flip-angle scale in percent of nominal); spectrum:
 * {@code _MWFmap} in percent (the first fraction window); each analysis its status map
 * {@code _desc-fitstatus_dseg} / {@code _desc-spectrumstatus_dseg} (the voxel status codes) and a
 * JSON sidecar per map with {@code Units}, {@code Sources} and the settings.
 */
final class Derivatives {
    private Derivatives() { }

    /** One derivative: pipeline output name, file suffix, factor to the written unit, unit. */
    private record Out(String output, String suffix, double factor, String units) { }

    private static List<Out> outputs(VolumeMaps maps) {
        if (maps.analysis().kind() == VolumeAnalysis.Kind.FIT) {
            return List.of(new Out("t2_ms", "T2map", 1e-3, "s"), new Out("amplitude", "M0map", 1, "arbitrary"),
                    new Out("b1_scale", "desc-fittedflip_TB1map", 100, "percent"));
        }
        String fraction = maps.mapNames().stream().filter(n -> n.startsWith("fraction_")).findFirst()
                .orElseThrow(() -> new IllegalStateException("spectrum without a fraction window"));
        return List.of(new Out(fraction, "MWFmap", 100, "percent"));
    }

    /**
     * @param anat the output {@code anat/} directory
     * @param c the collection
     * @param unit its subject/session
     * @param maps the analysis' maps
     * @param labels label per voxel, or null
     * @param sources input files relative to the dataset root (for {@code Sources})
     * @return table rows of the written maps
     */
    static List<CohortRow> write(Path anat, MeseCollection c, SubjectUnit unit, VolumeMaps maps, float[] labels,
            List<String> sources) {
        boolean fit = maps.analysis().kind() == VolumeAnalysis.Kind.FIT;
        NiftiHeader h = maps.mapHeader();
        byte[] status = maps.status();
        List<CohortRow> rows = new ArrayList<>();
        for (Out o : outputs(maps)) {
            float[] v = maps.map(o.output());
            for (int i = 0; i < v.length; i++) {
                v[i] = (float) (v[i] * o.factor());
            }
            String name = c.entities() + "_" + o.suffix();
            Nifti.write(anat.resolve(name + ".nii.gz"), VolumeMaps.estimateHeader(h, o.suffix(), o.units()), v, false);
            sidecar(anat.resolve(name + ".json"), o.units(), sources, maps);
            for (RegionStatistics s : RegionStatistics.perRegion(v, status, labels, c.entities() + " labels")) {
                rows.add(new CohortRow(unit.subject(), unit.session(), c.acquisition(), c.run(), o.suffix(), o.units(), s));
            }
        }
        String st = c.entities() + "_desc-" + (fit ? "fit" : "spectrum") + "status_dseg";
        float[] codes = new float[status.length];
        for (int i = 0; i < codes.length; i++) {
            codes[i] = status[i];
        }
        Nifti.write(anat.resolve(st + ".nii.gz"), VolumeMaps.statusHeader(h), codes, false);
        sidecar(anat.resolve(st + ".json"), "status code: 0 outside mask, 1 ok, 2 hit bound, 3 low signal, "
                + "4 invalid input, 5 not converged", sources, maps);
        return rows;
    }

    private static void sidecar(Path file, String units, List<String> sources, VolumeMaps maps) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("Units", units);
        m.put("Sources", sources);
        m.put("Method", maps.analysis().kind() == VolumeAnalysis.Kind.FIT
                ? "EPG T2 and B1 fit of the multi-echo decay (Lebel and Wilman 2010; Weigel 2015)"
                : "NNLS T2 spectrum on an EPG basis, regularised (Prasloski et al. 2012)");
        m.put("Settings", maps.analysis().describe());
        try {
            AtomicFiles.writeString(file, Json.MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(m) + "\n", false);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /**
     * Writes {@code dataset_description.json} of the derivatives dataset if it does not exist.
     *
     * @param out the output directory
     * @param commandLine the command line
     */
    static void describe(org.apache.hadoop.fs.Path out, String commandLine) {
        org.apache.hadoop.fs.Path f = new org.apache.hadoop.fs.Path(out, "dataset_description.json");
        if (Storage.exists(f)) {
            return;
        }
        String version = Derivatives.class.getPackage().getImplementationVersion();
        Map<String, Object> g = new LinkedHashMap<>();
        g.put("Name", "echotrellis");
        g.put("Version", version == null ? "development" : version);
        g.put("CommandLine", commandLine);
        Map<String, Object> d = new LinkedHashMap<>();
        d.put("Name", "echotrellis cohort derivatives");
        d.put("BIDSVersion", "1.10.0");
        d.put("DatasetType", "derivative");
        d.put("GeneratedBy", List.of(g));
        try {
            Storage.writeText(f, Json.MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(d) + "\n");
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }
}
