package org.echotrellis.cli;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.echotrellis.design.DesignReport;
import org.echotrellis.image.ImageReport;
import org.echotrellis.design.ExposureSummary;
import org.echotrellis.design.IecLimits;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.spectrum.FractionWindow;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.fit.volume.SpectrumNames;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.report.MapSpec;
import org.echotrellis.report.SpectrumSamples;
import org.echotrellis.report.VolumeSections;
import org.echotrellis.report.Report;
import org.echotrellis.report.Section;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.jfree.chart.JFreeChart;

/** Report sections of the single-protocol commands (simulate, pathways, design) and the acquisition settings. */
final class CommandReports {
    private CommandReports() { }

    /** The acquisition as read from the protocol file: name, tissue, B1, echoes and, for CPMG trains, timing and flips. */
    static Map<String, Object> acquisition(Protocol p) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("protocol", p.name());
        m.put("description", p.description());
        m.put("tissue T1 (ms)", p.tissue().t1Ms());
        m.put("tissue T2 (ms)", p.tissue().t2Ms());
        m.put("B1 scale", p.b1Scale());
        m.put("echoes", p.echoCount());
        m.put("events", p.events().size());
        p.cpmg().ifPresent(c -> cpmg(m, c));
        return m;
    }

    private static void cpmg(Map<String, Object> m, CpmgTrain c) {
        m.put("echo spacing (ms)", c.echoSpacingMs());
        m.put("excitation flip (deg)", c.excitationFlipDeg());
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double f : c.refocusFlipsDeg()) {
            lo = Math.min(lo, f);
            hi = Math.max(hi, f);
        }
        m.put("refocusing flips (deg)", lo == hi ? Tables.num(lo) : Tables.num(lo) + " – " + Tables.num(hi));
    }

    static void simulate(Report r, Protocol p, EchoTrain train, JFreeChart chart) {
        Section s = r.section("Echo train");
        s.chart(chart, 900, 560, "Predicted echo magnitudes of " + p.name() + " against echo time");
        List<List<?>> rows = new ArrayList<>();
        double[] t = train.timesMs();
        for (int i = 0; i < train.size(); i++) {
            rows.add(List.of(i + 1, train.labels().get(i), t[i], train.magnitude(i), train.phaseDeg(i)));
        }
        s.table("Echoes (M0 = 1)", List.of("echo", "label", "time (ms)", "magnitude", "phase (deg)"), rows);
    }

    static void pathways(Report r, String table, JFreeChart classes, JFreeChart diagram, String conditions) {
        r.section("Echo classes").paragraph(conditions)
                .chart(classes, 900, 560, "Contributions of the longitudinal-period classes to each echo")
                .preformatted("Table of classes (as printed)", table);
        r.section("Phase graph").chart(diagram, 1000, 600, "Phase graph of the sequence: dephasing order against time");
    }

    static void design(Report r, DesignReport d) {
        r.section("Caution").caution(IecLimits.CAUTION);
        r.section("Schedule").chart(DesignOutputs.scheduleChart(d), 900, 540, "Refocusing flip angle per echo");
        r.section("Echoes").chart(DesignOutputs.echoChart(d), 900, 540,
                "Predicted echoes of the design tissue and the compared tissues");
        ExposureSummary x = d.exposure();
        Map<String, Object> f = new LinkedHashMap<>();
        f.put("relative SAR (refocusing, vs all-180°)", x.relativeSar());
        f.put("relative SAR budget", x.limits().sarBudget());
        f.put("relative SAR with the excitation", x.relativeSarWithExcitation());
        f.put("B1+rms (µT)", x.b1rmsUt());
        f.put("B1+rms limit (µT)", x.limits().hasB1rmsLimit() ? x.limits().b1rmsLimitUt() : Double.NaN);
        f.put("B1+rms of the all-180° train (µT)", x.b1rms180Ut());
        f.put("refocusing B1 peak (µT)", x.maxRefocusB1PeakUt());
        f.put("excitation B1 peak (µT)", x.excitationB1PeakUt());
        f.put("SAR estimate from the reference (W/kg)", x.sarEstimateWPerKg());
        f.put("within the limits", x.withinLimits() ? "yes" : "NO — limits exceeded");
        r.section("RF exposure against the limits").caution(IecLimits.CAUTION).facts(f)
                .chart(DesignOutputs.sarChart(d), 900, 540, "Relative RF energy of the schedule against the budget")
                .preformatted("Table and summary (as printed)", DesignOutputs.table(d));
    }

    static void spectrumVolume(Report r, VolumeResult res, SpectrumOptions o) {
        List<MapSpec> maps = new ArrayList<>();
        for (String n : SpectrumNames.scalars(o)) {
            if (n.equals("chi2_unregularised")) {
                continue;
            }
            String group = n.startsWith("gm_t2_") ? "gm_t2" : n.startsWith("fraction_") ? "fraction" : null;
            double lo = n.startsWith("fraction_") ? 0 : Double.NaN;
            maps.add(new MapSpec(n, SpectrumVolumes.title(n), SpectrumVolumes.unit(n), group, lo, Double.NaN));
        }
        List<MapSpec> head = new ArrayList<>();
        for (MapSpec m : maps) {
            if (m.name().equals("gm_t2_ms") || m.name().startsWith("fraction_")) {
                head.add(m);
            }
        }
        VolumeSections.headline(r, res, head);
        Map<String, double[]> ranges = VolumeSections.ranges(res, maps);
        VolumeSections.montages(r, res, maps, ranges);
        VolumeSections.histograms(r, res, maps, ranges);
        double[] t2 = o.grid().t2Ms();
        List<String> bins = new ArrayList<>();
        for (int j = 0; j < t2.length; j++) {
            bins.add(SpectrumNames.binOutput(j, t2[j]));
        }
        List<double[]> windows = new ArrayList<>();
        for (FractionWindow w : o.windows()) {
            windows.add(new double[] {w.loMs(), w.hiMs()});
        }
        SpectrumSamples.add(r, res, t2, bins, "gm_t2_ms", "chi2", windows);
    }

    static void image(Report r, ImageReport report, String name) {
        r.section("Image figures")
                .chart(ImageOutputs.weightsChart(report, name + ": k-space weights"), 900, 540,
                        "k-space weight of each echo per tissue")
                .chart(ImageOutputs.psfChart(report, name + ": point-spread function"), 900, 540,
                        "Point-spread function per tissue")
                .preformatted("Table (as printed)", ImageOutputs.table(report, name));
    }
}
