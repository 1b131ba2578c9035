package org.echotrellis.cli;

/** Entry point of the echotrellis command-line tool. */
public final class Main {
    private Main() { }

    /** @param args command-line arguments */
    public static void main(String[] args) {
        System.exit(0);
    }
}
