package org.echotrellis.cli;

import java.nio.file.Path;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Tissue;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * The protocol file argument with the tissue and B1 overrides shared by {@code simulate} and
 * {@code pathways}.
 */
final class ProtocolInput {
    @picocli.CommandLine.Spec(picocli.CommandLine.Spec.Target.MIXEE)
    picocli.CommandLine.Model.CommandSpec mixee;

    @Parameters(index = "0", paramLabel = "FILE", description = "Protocol file (.yaml, .yml or .json).")
    Path file;

    @Option(names = "--t1-ms", paramLabel = "MS", description = "Override the tissue T1 in ms ('inf' for no T1 recovery).")
    Double t1Ms;

    @Option(names = "--t2-ms", paramLabel = "MS", description = "Override the tissue T2 in ms ('inf' for no T2 decay).")
    Double t2Ms;

    @Option(names = "--b1", paramLabel = "SCALE",
            description = "Override the B1 (flip-angle) scale, e.g. 0.8; it multiplies every pulse, excitation included.")
    Double b1;

    @Option(names = "--refocusing-flip-deg", paramLabel = "DEG",
            description = "Replace the protocol's constant refocusing flip (the excitation is unchanged; --b1 still scales both).")
    Double refocusingFlipDeg;

    /** @return the protocol read from FILE with the overrides applied */
    public Protocol load() {
        Protocol p = ProtocolReader.read(file);
        if (ProtocolReader.tissueAssumed(p) && (t1Ms == null || t2Ms == null) && mixee != null) {
            mixee.commandLine().getErr().println("note: " + file + " has no tissue section; assuming T1 "
                    + Tables.num(p.tissue().t1Ms()) + " ms, T2 " + Tables.num(p.tissue().t2Ms())
                    + " ms (add tissue: to the protocol, or give --t1-ms and --t2-ms)");
        }
        Tissue t = p.tissue();
        if (t1Ms != null) {
            t = t.withT1Ms(CliChecks.positiveOrInf("--t1-ms", t1Ms));
        }
        if (t2Ms != null) {
            t = t.withT2Ms(CliChecks.positiveOrInf("--t2-ms", t2Ms));
        }
        double scale = b1 == null ? p.b1Scale() : CliChecks.b1("--b1", b1);
        Protocol q = refocusingFlipDeg == null ? p
                : CliChecks.asOptions(() -> p.withConstantRefocusFlipDeg(refocusingFlipDeg), "refocusing_flip_deg");
        return q.withTissue(t).withB1Scale(scale);
    }
}
