package org.echotrellis.fit;

/** Lets the spectrum floor test keep its figures beside the fit's (target/floors). */
public final class SliceFitFloorTestAccess {
    private SliceFitFloorTestAccess() { }

    /**
     * @param name file name in target/floors
     * @param text the figures
     */
    public static void record(String name, String text) {
        SliceFitFloorTest.record(name, text);
    }
}
