package org.echotrellis.design;

import org.echotrellis.image.KSpaceOrdering;
import org.echotrellis.image.PsfFigures;
import org.echotrellis.image.PsfKernel;

/**
 * Evaluates the objectives on image figures ({@link Objective.PsfWidth},
 * {@link Objective.ContrastAtWidth}): the whole train is simulated with the real CPMG stepper, its
 * magnitudes laid across k-space and the PSF figures taken from a {@link PsfKernel} that is built
 * once per ordering and reused (O(E·L) per evaluation, no allocation once built). One instance per
 * thread.
 */
final class ImageObjectives {
    private final CpmgStepper stepper = new CpmgStepper();
    private double[] echoes = new double[0];
    private PsfKernel kernel;
    private KSpaceOrdering ordering;

    /** @return the objective value of a schedule (larger is better) */
    double value(Objective objective, DesignProblem p, double[] flipsDeg) {
        if (objective instanceof Objective.PsfWidth w) {
            kernel(w.lines(), p.echoes(), w.echo());
            simulate(p, w.t1(), w.t2(), flipsDeg);
            double centre = Math.abs(echoes[w.echo() - 1]);
            if (centre < w.minSignal()) {
                return centre / w.minSignal() - 1;
            }
            PsfFigures f = kernel.figures(echoes);
            if (!(f.sidelobe() <= w.maxSidelobe())) {
                return Double.isFinite(f.sidelobe()) ? w.maxSidelobe() - f.sidelobe() : -1;
            }
            return Double.isFinite(f.fwhmPx()) && f.fwhmPx() > 0 ? 1 / f.fwhmPx() : 0;
        }
        Objective.ContrastAtWidth c = (Objective.ContrastAtWidth) objective;
        kernel(c.lines(), p.echoes(), c.echo());
        simulate(p, c.t1A(), c.t2A(), flipsDeg);
        double a = Math.abs(echoes[c.echo() - 1]);
        PsfFigures fa = kernel.figures(echoes);
        simulate(p, c.t1B(), c.t2B(), flipsDeg);
        double b = Math.abs(echoes[c.echo() - 1]);
        PsfFigures fb = kernel.figures(echoes);
        double widest = Math.max(width(fa, c.lines()), width(fb, c.lines()));
        return widest > c.maxFwhmPx() ? -(widest - c.maxFwhmPx()) : Math.abs(a - b);
    }

    private static double width(PsfFigures f, int lines) {
        return Double.isFinite(f.fwhmPx()) ? f.fwhmPx() : lines;
    }

    private void kernel(int lines, int n, int centreEcho) {
        if (ordering == null || ordering.lines() != lines || ordering.echoes() != n || ordering.centerEcho() != centreEcho) {
            ordering = KSpaceOrdering.linear(lines, n, centreEcho);
            kernel = new PsfKernel(ordering);
        }
    }

    private void simulate(DesignProblem p, double t1, double t2, double[] flipsDeg) {
        if (echoes.length != p.echoes()) {
            echoes = new double[p.echoes()];
        }
        stepper.run(p.echoes(), p.echoSpacingMs(), t1, t2, p.b1Scale(), p.excitationFlipDeg(), flipsDeg, echoes);
    }
}
