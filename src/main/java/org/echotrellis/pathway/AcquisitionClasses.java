package org.echotrellis.pathway;

import java.util.ArrayList;
import java.util.List;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.LocalTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;

/**
 * Class decomposition of a whole acquisition (slice profile, repetition time): the classes of the train
 * each slice position sees ({@link LocalTrain}, ideal local pulses with the position's phase carried
 * to the echoes), weighted and summed over the positions. The summed classes add up to the echoes of
 * {@link Simulator#simulate(Protocol, double, double, double)}. Diffusion is refused: its attenuation
 * depends on each pathway's order history, which the classes do not keep.
 */
final class AcquisitionClasses {
    private AcquisitionClasses() { }

    static ClassDecomposition classes(Protocol p) {
        if (p.acquisition().diffuses(p.tissue().diffusivityMm2PerS())) {
            throw new InputException(p.source() + ": pathways does not decompose echoes with diffusion (tissue "
                    + "diffusivity_mm2_per_s with a crusher); set diffusivity_mm2_per_s to 0 or remove the crusher");
        }
        CpmgTrain train = p.train().orElseThrow();
        double t1 = p.tissue().t1Ms();
        double t2 = p.tissue().t2Ms();
        double b1 = p.b1Scale();
        List<LocalTrain> trains = Simulator.model(p, b1).localTrains(t1, t2, b1);
        int n = train.echoes();
        List<double[]> re = new ArrayList<>();
        List<double[]> im = new ArrayList<>();
        for (int e = 0; e < n; e++) {
            re.add(new double[0]);
            im.add(new double[0]);
        }
        ClassTracker tracker = new ClassTracker();
        for (LocalTrain lt : trains) {
            CpmgTrain local = new CpmgTrain(n, train.echoSpacingMs(), lt.excitationFlipDeg(), lt.excitationPhaseDeg(),
                    lt.refocusFlipsDeg(), lt.refocusPhasesDeg());
            Protocol lp = Protocol.ofTrain(p.name(), "", p.tissue(), 1.0, local, p.source());
            ClassDecomposition d = tracker.decompose(PathwayAnalysis.schedule(lp.events()), t1, t2, 1.0);
            double[] psi = lt.echoPhaseRad();
            for (int e = 0; e < n; e++) {
                int m = d.classCount(e);
                if (re.get(e).length < m) {
                    re.set(e, java.util.Arrays.copyOf(re.get(e), m));
                    im.set(e, java.util.Arrays.copyOf(im.get(e), m));
                }
                double c = Math.cos(psi[e]) * lt.weight();
                double s = Math.sin(psi[e]) * lt.weight();
                for (int k = 0; k < m; k++) {
                    double x = d.classRe(e, k);
                    double y = d.classIm(e, k);
                    re.get(e)[k] += c * x - s * y;
                    im.get(e)[k] += s * x + c * y;
                }
            }
        }
        int[] offset = new int[n + 1];
        for (int e = 0; e < n; e++) {
            offset[e + 1] = offset[e] + re.get(e).length;
        }
        double[] r = new double[offset[n]];
        double[] i = new double[offset[n]];
        for (int e = 0; e < n; e++) {
            System.arraycopy(re.get(e), 0, r, offset[e], re.get(e).length);
            System.arraycopy(im.get(e), 0, i, offset[e], im.get(e).length);
        }
        return new ClassDecomposition(p.echoLabels(), p.echoTimesMs(), offset, r, i);
    }
}
