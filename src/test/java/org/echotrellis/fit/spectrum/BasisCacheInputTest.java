package org.echotrellis.fit.spectrum;

import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;

class BasisCacheInputTest {

    @Test
    void excitationThatTipsNothingIsRefusedNamingTheProtocol() {
        // a 0° or 180° excitation leaves no transverse magnetisation: every echo is sin(α_exc)·(…) = 0
        // (Bloch rotation; common practice), so the whole basis would be zero and every voxel meaningless
        for (double exc : new double[] {0, 180, 360}) {
            CpmgTrain train = CpmgTrain.constant(8, 10, 160).withExcitationFlipDeg(exc);
            InputException e = assertThrows(InputException.class,
                    () -> BasisCache.build(train, 1000, T2Grid.forEchoTimes(10, 320), RefocusSearch.forTrain(180, true)), "excitation " + exc);
            assertTrue(e.getMessage().contains("excitation"), e.getMessage());
        }
        assertDoesNotThrow(() -> BasisCache.build(CpmgTrain.constant(8, 10, 160).withExcitationFlipDeg(30), 1000,
                T2Grid.forEchoTimes(10, 320), RefocusSearch.fixed(160)));
    }
}
