package org.echotrellis.cli;

/** One part of the {@code demo}: writes its figures into the demo directory and adds to the summary. */
interface DemoSection {
    /** @return a short title for the summary and the progress line */
    String title();

    /**
     * Runs this part of the demo.
     *
     * @param ctx output directory, summary and console
     * @throws Exception on failure (reported by the demo command)
     */
    void run(DemoContext ctx) throws Exception;
}
