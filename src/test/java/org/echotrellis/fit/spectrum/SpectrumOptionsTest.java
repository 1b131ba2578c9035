package org.echotrellis.fit.spectrum;

import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;

class SpectrumOptionsTest {

    @Test
    void repeatedWindowIsRefusedNamingTheOption() {
        // two equal windows would give two outputs of one name (fraction_10_40ms …): the second map
        // file would collide with the first after the whole volume was fitted
        List<FractionWindow> twice = List.of(FractionWindow.parse("10:40"), FractionWindow.parse("10.0:40"));
        InputException e = assertThrows(InputException.class,
                () -> SpectrumOptions.defaults(org.echotrellis.epg.CpmgTrain.constant(32, 10, 180), 1000, true).withWindows(twice));
        assertTrue(e.getMessage().contains("fraction_window_ms") && e.getMessage().contains("10:40"), e.getMessage());
        assertDoesNotThrow(() -> SpectrumOptions.defaults(org.echotrellis.epg.CpmgTrain.constant(32, 10, 180), 1000, true).withWindows(
                List.of(FractionWindow.parse("10:40"), FractionWindow.parse("10:50"))));
    }
}
