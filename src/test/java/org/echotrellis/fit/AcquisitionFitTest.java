package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;

import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.spectrum.BasisCache;
import org.echotrellis.fit.spectrum.SpectrumFit;
import org.echotrellis.fit.spectrum.SpectrumFitter;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.sequence.Acquisition;
import org.echotrellis.sequence.Crusher;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.Tissue;
import org.junit.jupiter.api.Test;

/**
 * Protocols with a repetition time or diffusion are fitted, not refused, with the whole acquisition
 * as the model: noise-free trains of the acquisition model come back (a self-consistency check of
 * the tabulated path), and ignoring TR biases the fit (the reason the key exists; Bernstein, King
 * &amp; Zhou, Handbook of MRI Pulse Sequences, 2004, for the spin-echo TR dependence).
 */
class AcquisitionFitTest {
    static Protocol protocol(double trMs, double diffusivity, Optional<Crusher> crusher) {
        Acquisition a = new Acquisition(Optional.empty(), Optional.empty(), false, 1, trMs, crusher);
        return Protocol.ofTrain("tr", "", new Tissue("fluid", 3000, 500, diffusivity), 1, CpmgTrain.constant(16, 10, 180),
                "test", a);
    }

    @Test
    void repetitionTimeAndDiffusionAreFittedWithTheirOwnModel() {
        Protocol[] ps = {protocol(1500, 0, Optional.empty()),
            protocol(Double.POSITIVE_INFINITY, 0.003, Optional.of(new Crusher(4, 1.0)))};
        for (Protocol p : ps) {
            assertTrue(!p.isIdealAcquisition());
            T2Fit fit = new T2Fit.Factory(FitSettings.defaults(p).withT2Bounds(100, 3000).withB1Bounds(0.6, 1.2), FitModel.EPG,
                    false).newKernel();
            for (double b1 : new double[] {0.75, 0.9}) {
                double[] y = Simulator.simulate(p, 3000, 500, b1).magnitudes();
                T2Estimate e = fit.estimate(y, Double.NaN);
                assertEquals(500, e.t2Ms(), 500 * 0.005, p.acquisition() + " B1 " + b1);
                assertEquals(b1, e.b1Scale(), 0.01, p.acquisition() + " B1 " + b1);
            }
            SpectrumOptions o = SpectrumOptions.defaults(p);
            SpectrumFit f = new SpectrumFitter(BasisCache.build(p, o.t1Ms(), o.grid(), o.search()), o)
                    .fit("fluid", Simulator.simulate(p, 3000, 500, 0.9).magnitudes());
            assertEquals(162, f.refocusDeg(), 1.0, p.acquisition().toString());
        }
    }
}
