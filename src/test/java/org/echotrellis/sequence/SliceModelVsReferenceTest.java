package org.echotrellis.sequence;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The slice-selective acquisition model against the independent isochromat Bloch simulation
 * {@link SliceBlochReference}: complex echoes within 1e-3 of echo 1.
 */
class SliceModelVsReferenceTest {

    static Protocol protocol(String shape, double tbw, double ratio, double exc, double ref, int echoes, double esp,
                             double trMs) {
        CpmgTrain t = CpmgTrain.of(echoes, esp, exc, filled(echoes, ref));
        RfPulse e = RfPulse.of(shape, tbw, 2);
        RfPulse r = RfPulse.of(shape, tbw, 2);
        Acquisition a = new Acquisition(Optional.of(e), Optional.of(r), true, ratio, trMs, Optional.empty());
        return Protocol.ofTrain("slice", "", new Tissue("x", 1000, 80), 1.0, t, "test", a);
    }

    static double[] filled(int n, double v) {
        double[] f = new double[n];
        java.util.Arrays.fill(f, v);
        return f;
    }

    @ParameterizedTest
    @CsvSource({
        "sinc, 4, 1, 0.6", "sinc, 4, 1, 0.9", "sinc, 4, 1, 1.2", "sinc, 4, 2, 0.75", "sinc, 4, 2, 1.1",
        "gauss, 3, 1, 0.6", "gauss, 3, 1, 1.0", "gauss, 3, 2, 1.2", "gauss, 3, 2, 0.8"})
    void agreesWithIsochromatReference(String shape, double tbw, double ratio, double b1) {
        int echoes = 24;
        double t2 = 60;
        Protocol p = protocol(shape, tbw, ratio, 90, 180, echoes, 10, Double.POSITIVE_INFINITY);
        EchoTrain model = Simulator.simulate(p, 1000, t2, b1);
        double[][] ref = SliceBlochReference.echoes(SliceBlochReference.Settings.of(shape, tbw, ratio, 90, 180, echoes,
                10, 1000, t2, b1));
        double scale = Math.hypot(ref[0][0], ref[1][0]);
        double worst = 0;
        for (int n = 0; n < echoes; n++) {
            worst = Math.max(worst, Math.hypot(model.re()[n] - ref[0][n], model.im()[n] - ref[1][n]));
        }
        assertTrue(worst <= 1e-3 * scale, "worst |model - reference| = " + worst / scale + " of echo 1");
    }
}
