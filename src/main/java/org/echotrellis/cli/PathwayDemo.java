package org.echotrellis.cli;

import java.util.Locale;
import org.echotrellis.pathway.ClassDecomposition;
import org.echotrellis.pathway.Pathway;
import org.echotrellis.pathway.PathwayAnalysis;
import org.echotrellis.pathway.PathwaySearch;
import org.echotrellis.pathway.PhaseGraph;
import org.echotrellis.pathway.TopPathways;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.plot.ClassContributionChart;
import org.echotrellis.plot.PhaseGraphDiagram;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;

/**
 * Demo part: where the stimulated echoes of the knee train at B1 = 0.8 come from — the stimulated
 * share of every echo, the class-contribution chart, the largest pathways of echo 4 and the phase graph.
 */
final class PathwayDemo implements DemoSection {
    static final double B1 = 0.8;
    static final int ECHO = 4;

    @Override
    public String title() {
        return "coherence pathways of the knee train at B1 = 0.8";
    }

    @Override
    public void run(DemoContext ctx) {
        Protocol p = ProtocolReader.readBuiltIn("knee-t2-16.yaml").withB1Scale(B1);
        ClassDecomposition d = PathwayAnalysis.classes(p);
        String conditions = String.format(Locale.ROOT, "T1 = %.0f ms, T2 = %.0f ms, B1 = %.1f (refocusing %.0f°)",
                p.tissue().t1Ms(), p.tissue().t2Ms(), B1, 180 * B1);
        ChartFiles.writePngAndSvg(ClassContributionChart.create("Knee train: spin-echo and stimulated-echo classes per echo",
                conditions, d), ctx.outDir(), "knee-pathway-classes", 900, 560, ctx.force());
        PhaseGraph g = PathwayAnalysis.phaseGraph(p, 1e-3, 100_000, Double.POSITIVE_INFINITY);
        String sub = conditions + "; states below 0.001 of M0 not drawn";
        ChartFiles.writePngAndSvg(PhaseGraphDiagram.create("Knee train: phase graph", sub, g), ctx.outDir(),
                "knee-phase-graph", 1000, 600, ctx.force());
        TopPathways tp = PathwayAnalysis.topPathways(p, d, ECHO, PathwaySearch.Limits.of(5));

        StringBuilder s = ctx.summary();
        s.append("## Coherence pathways at B1 = 0.8\n\n")
                .append(String.format(Locale.ROOT, "Protocol `%s`, %s. ", p.name(), conditions))
                .append("Stimulated share = the part of each echo that comes through pathways which spent at least ")
                .append("one period as dephased longitudinal magnetization (`echotrellis pathways`).\n\n")
                .append("| echo | TE (ms) | magnitude | spin-echo part (m = 0) | stimulated share |\n")
                .append("|---|---|---|---|---|\n");
        for (int e = 0; e < d.echoCount(); e++) {
            s.append(String.format(Locale.ROOT, "| %d | %.0f | %.4f | %.4f | %.1f %% |%n", e + 1, d.timeMs(e),
                    d.magnitude(e), d.projected(e, 0, 0), 100 * d.stimulatedShare(e)));
        }
        s.append(String.format(Locale.ROOT, "%nLargest pathways of echo %d (|A| = %.4f):%n%n", ECHO,
                Math.hypot(tp.echoRe(), tp.echoIm())))
                .append("| pathway | amplitude along the echo | share | m |\n|---|---|---|---|\n");
        for (Pathway pw : tp.pathways()) {
            s.append(String.format(Locale.ROOT, "| `%s` | %+.4f | %+.1f %% | %d |%n", pw.states(),
                    pw.share() * Math.hypot(tp.echoRe(), tp.echoIm()), 100 * pw.share(), pw.longitudinalIntervals()));
        }
        s.append(String.format(Locale.ROOT, "| (all other pathways) | | %+.1f %% | |%n", 100 * tp.unexplainedShare()))
                .append("\nFigures: `knee-pathway-classes.png`, `knee-phase-graph.png` (and `.svg`).\n\n");
    }
}
