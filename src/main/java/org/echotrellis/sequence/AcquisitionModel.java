package org.echotrellis.sequence;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.epg.SteadyCpmgEngine;

/**
 * The echo train of a whole acquisition — slice integral, steady state over the repetition time and
 * diffusion — built once per protocol and then evaluated fast for any (T1, T2, B1): the path for
 * dictionaries and fitting tables. {@link Simulator#simulate(Protocol, double, double, double)} uses it
 * for every protocol whose acquisition is not ideal.
 *
 * <p><b>Model.</b> Every slice position z gets the local rotations of the actual pulses at the actual
 * B1: B1 scales the RF amplitude, so each pulse is Bloch-simulated with its gradient at amplitude
 * B1 &times; nominal flip ({@link PulseRotation}, referred to its centre). The rotations are tabulated
 * once per protocol for every position over the amplitude range [0, {@code b1Max} &times; largest flip] in
 * steps of {@value #GRID_DEG}&deg; and read back by 4-point Lagrange interpolation (error below 1e-7 of a
 * rotation parameter). At each position the complex EPG with the full Cayley–Klein rotation
 * ({@link TrainKernel}) gives the echoes; the echo is their integral across the slice per unit slice
 * width ({@link SliceGrid}). Non-selective protocols have one position with ideal rotations.
 *
 * <p><b>Repetition time</b> (ideal spoiling before each excitation): the longitudinal magnetization
 * before the excitation, M, maps to Z<sub>0</sub> at the last echo as a&middot;M + b; T1 recovery over
 * TR &minus; N&middot;ESP then gives M' = E(aM + b) + 1 &minus; E, E = exp(&minus;(TR &minus; N&middot;ESP)/T1), with the fixed
 * point M = (bE + 1 &minus; E)/(1 &minus; aE), per position. The echoes scale with M (only the odd family
 * reaches them).
 *
 * <p><b>Diffusion</b> (Weigel et al., J Magn Reson 205:276, 2010): each half echo spacing next to a
 * refocusing pulse of duration τ is, from the pulse outwards, τ/2 at the state's order, a crusher lobe
 * of δ moving the order by one (wave number K = 2πq per order), and the rest without gradient; an F state
 * starting at wave number k over an interval t with gradient step Δk is multiplied by
 * exp(&minus;D t (k² + kΔk + Δk²/3)), a Z state by exp(&minus;D t k²).
 *
 * <p>Thread-safe and allocation-free after warm-up: each thread gets its own workspace.
 * Cost: about (positions) &times; (1, or 3 with TR) &times; N²/4 complex state updates per train.
 */
public final class AcquisitionModel {
    /** Trains evaluated together by {@link #echoes(double[], double[], double[], int, double[], double[])}. */
    public static final int LANES = 8;
    /** Amplitude grid step of the rotation tables, degrees. */
    public static final double GRID_DEG = 2.0;

    private final int echoes;
    private final double espMs;
    private final double repetitionMs;
    private final double excFlipRad;
    private final double excPhaseRad;
    private final double[] kindFlipRad;
    private final double[] kindPhaseRad;
    private final int[] kindOf;
    private final double frameRad;
    private final boolean selective;
    private final SliceGrid grid;
    private final int gridPoints;
    private final double gridStep;
    private final double b1Max;
    private final double[] excTable;
    private final double[] refTable;
    private final double[] dPre;
    private final double[] dPost;
    private final double[] dZ;
    private final ThreadLocal<Work> work;
    private final CpmgTrain realTrain;
    private final PulseShape excEnvelope;
    private final PulseShape refEnvelope;

    private AcquisitionModel(Protocol p, double b1Max) {
        CpmgTrain train = p.train().orElseThrow(() -> new IllegalArgumentException(
                "the acquisition model needs a protocol in the shorthand train form"));
        Acquisition acq = p.acquisition();
        Checks.inRange("b1Max", b1Max, 0.01, 10, null);
        this.b1Max = b1Max;
        echoes = train.echoes();
        espMs = train.echoSpacingMs();
        repetitionMs = acq.repetitionMs();
        selective = acq.sliceSelective();
        boolean symmetric = !selective || (palindrome(acq.excitationPulse().get().envelope())
                && palindrome(acq.refocusingPulse().get().envelope()));
        boolean halfLine = selective && symmetric && train.isCpmgPhased();
        // In the half-line case work in the frame where the excitation phase is 90 degrees (mirror
        // positions are complex conjugates there) and rotate back at the end.
        frameRad = halfLine ? Math.toRadians(train.excitationPhaseDeg() - 90) : 0;
        excFlipRad = Math.toRadians(train.excitationFlipDeg());
        excPhaseRad = Math.toRadians(train.excitationPhaseDeg()) - frameRad;
        List<double[]> kinds = new ArrayList<>();
        kindOf = new int[echoes];
        for (int i = 0; i < echoes; i++) {
            double[] k = {Math.toRadians(train.refocusFlipDeg(i)), Math.toRadians(train.refocusPhaseDeg(i)) - frameRad};
            int found = -1;
            for (int j = 0; j < kinds.size(); j++) {
                if (kinds.get(j)[0] == k[0] && kinds.get(j)[1] == k[1]) {
                    found = j;
                    break;
                }
            }
            if (found < 0) {
                found = kinds.size();
                kinds.add(k);
            }
            kindOf[i] = found;
        }
        kindFlipRad = new double[kinds.size()];
        kindPhaseRad = new double[kinds.size()];
        double maxFlip = excFlipRad;
        for (int j = 0; j < kinds.size(); j++) {
            kindFlipRad[j] = kinds.get(j)[0];
            kindPhaseRad[j] = kinds.get(j)[1];
            maxFlip = Math.max(maxFlip, kindFlipRad[j]);
        }
        gridStep = Math.toRadians(GRID_DEG);
        gridPoints = Math.max(4, (int) Math.ceil(maxFlip * b1Max / gridStep) + 3);
        if (selective) {
            double[] es = PulseRotation.steps(acq.excitationPulse().get().envelope(), PulseRotation.STEPS);
            double[] rs = PulseRotation.steps(acq.refocusingPulse().get().envelope(), PulseRotation.STEPS);
            grid = SliceGrid.of(acq, train, es, rs, b1Max, halfLine);
            excTable = table(es, grid.excitationFreq());
            refTable = table(rs, grid.refocusingFreq());
        } else {
            grid = null;
            excTable = null;
            refTable = null;
        }
        int len = TrainKernel.factorLength(echoes);
        dPre = new double[len];
        dPost = new double[len];
        dZ = new double[len];
        diffusionFactors(acq, p.tissue().diffusivityMm2PerS());
        int positions = selective ? grid.size() : 1;
        realTrain = !selective && train.isCpmgPhased() ? train : null;
        excEnvelope = selective ? acq.excitationPulse().get().envelope() : null;
        refEnvelope = selective ? acq.refocusingPulse().get().envelope() : null;
        work = ThreadLocal.withInitial(() -> new Work(echoes, kindFlipRad.length, positions, dPre, dPost, dZ));
    }

    /**
     * Builds the model of a protocol for B1 up to {@code b1Max}.
     *
     * @param p the protocol (shorthand train form); its tissue's diffusivity is used
     * @param b1Max largest B1 scale that will be evaluated (tables cover it)
     * @return the model
     */
    static AcquisitionModel of(Protocol p, double b1Max) {
        return new AcquisitionModel(p, b1Max);
    }

    /** @return number of echoes */
    public int echoes() {
        return echoes;
    }

    /** @return largest B1 scale the tables cover */
    public double b1Max() {
        return b1Max;
    }

    /** @return number of slice positions simulated (1 if non-selective) */
    public int positions() {
        return selective ? grid.size() : 1;
    }

    private double[] table(double[] steps, double[] freq) {
        double[] t = new double[freq.length * gridPoints * 4];
        double[] r = new double[4];
        for (int i = 0; i < freq.length; i++) {
            for (int g = 0; g < gridPoints; g++) {
                PulseRotation.centre(steps, g * gridStep, freq[i], r);
                System.arraycopy(r, 0, t, (i * gridPoints + g) * 4, 4);
            }
        }
        return t;
    }

    private void diffusionFactors(Acquisition acq, double d) {
        Arrays.fill(dPre, 1.0);
        Arrays.fill(dPost, 1.0);
        Arrays.fill(dZ, 1.0);
        if (!acq.diffuses(d)) {
            return;
        }
        Crusher c = acq.crusher().get();
        double kk = c.waveNumberPerMm();
        double bq = d * kk * kk * 1e-3; // per ms per order^2 (D in mm^2/s, times in ms)
        double delta = c.durationMs();
        double tau2 = 0.5 * acq.refocusingDurationMs();
        double rest = Math.max(0, 0.5 * espMs - delta - tau2);
        int kmax = 2 * echoes + 1;
        for (int i = 0; i < dPre.length; i++) {
            double k = i - (kmax + 1);
            double cr = delta * (k * k + k + 1.0 / 3);
            dPre[i] = Math.exp(-bq * (rest * k * k + cr + tau2 * (k + 1) * (k + 1)));
            dPost[i] = Math.exp(-bq * (tau2 * k * k + cr + rest * (k + 1) * (k + 1)));
            dZ[i] = Math.exp(-bq * 0.5 * espMs * i * (double) i);
        }
    }

    private static boolean palindrome(PulseShape s) {
        double[] v = s.samples();
        for (int i = 0, j = v.length - 1; i < j; i++, j--) {
            if (Math.abs(v[i] - v[j]) > 1e-12) {
                return false;
            }
        }
        return true;
    }

    /**
     * Echo magnitudes |echo n|, n = 1..N (M0 = 1, per unit slice width when slice-selective).
     * Allocation-free after the first call on a thread.
     *
     * @param t1Ms T1 in ms (+Infinity allowed)
     * @param t2Ms T2 in ms (+Infinity allowed)
     * @param b1 B1 scale, (0, {@link #b1Max()}]
     * @param out receives the N magnitudes; modified
     */
    public void magnitudes(double t1Ms, double t2Ms, double b1, double[] out) {
        Work w = work.get();
        echoes(t1Ms, t2Ms, b1, out, w.im2);
        for (int e = 0; e < echoes; e++) {
            out[e] = Math.hypot(out[e], w.im2[e]);
        }
    }

    /**
     * Complex echoes F+<sub>0</sub> at the echo times (M0 = 1, per unit slice width when slice-selective).
     * Allocation-free after the first call on a thread.
     *
     * @param t1Ms T1 in ms (+Infinity allowed)
     * @param t2Ms T2 in ms (+Infinity allowed)
     * @param b1 B1 scale, (0, {@link #b1Max()}]
     * @param outRe receives the real parts (length &ge; N); modified
     * @param outIm receives the imaginary parts (length &ge; N); modified
     */
    public void echoes(double t1Ms, double t2Ms, double b1, double[] outRe, double[] outIm) {
        if (!(b1 > 0) || b1 > b1Max * (1 + 1e-12)) {
            throw new IllegalArgumentException("b1 must be within (0, " + b1Max + "], got " + b1);
        }
        Work w = work.get();
        if (realTrain != null) {
            w.t1[0] = t1Ms;
            w.t2[0] = t2Ms;
            w.b1[0] = b1;
            real(w, 1, outRe, outIm);
            return;
        }
        double e2h = Math.exp(-0.5 * espMs / t2Ms);
        double e1h = Math.exp(-0.5 * espMs / t1Ms);
        boolean tr = Double.isFinite(repetitionMs);
        double eRec = tr ? Math.exp(-(repetitionMs - echoes * espMs) / t1Ms) : 0;
        Arrays.fill(outRe, 0, echoes, 0.0);
        Arrays.fill(outIm, 0, echoes, 0.0);
        int positions = positions();
        double[] r = w.rot;
        for (int i = 0; i < positions; i++) {
            double weight = selective ? grid.weights()[i] : 1.0;
            // excitation
            if (selective) {
                interpolate(excTable, i, b1 * excFlipRad, r);
            } else {
                ideal(b1 * excFlipRad, r);
            }
            phase(r, excPhaseRad);
            double ar = r[0];
            double ai = r[1];
            double br = r[2];
            double bi = r[3];
            double f0r = 2 * (ar * br + ai * bi);
            double f0i = 2 * (ar * bi - ai * br);
            double z0 = ar * ar + ai * ai - br * br - bi * bi;
            for (int k = 0; k < kindFlipRad.length; k++) {
                if (selective) {
                    interpolate(refTable, i, b1 * kindFlipRad[k], r);
                } else {
                    ideal(b1 * kindFlipRad[k], r);
                }
                phase(r, kindPhaseRad[k]);
                TrainKernel.coefficients(r[0], r[1], r[2], r[3], w.coef, 18 * k);
            }
            double m = 1.0;
            if (tr) {
                double a = w.kernel.run(w.coef, kindOf, false, 0, 0, z0, false, e2h, e1h, 0, null, null);
                double b = w.kernel.run(w.coef, kindOf, false, 0, 0, 0, true, e2h, e1h, 0, null, null);
                m = (b * eRec + 1 - eRec) / (1 - a * eRec);
            }
            w.kernel.run(w.coef, kindOf, true, f0r, f0i, 0, false, e2h, e1h, weight * m, outRe, outIm);
        }
        if (selective && grid.halfLine()) {
            double c = Math.cos(frameRad);
            double s = Math.sin(frameRad);
            for (int e = 0; e < echoes; e++) {
                double v = outRe[e];
                outRe[e] = v * c;
                outIm[e] = v * s;
            }
        }
    }

    /**
     * Up to {@link #LANES} trains at once (lock-step lanes on the real CPMG fast path of non-selective
     * CPMG-phased protocols; one after the other otherwise). Allocation-free after warm-up.
     *
     * @param t1Ms T1 per train (ms); not modified
     * @param t2Ms T2 per train (ms); not modified
     * @param b1 B1 per train; not modified
     * @param count trains (1..{@link #LANES})
     * @param outRe receives Re echo n of train l at [l*N + n]; modified
     * @param outIm receives Im likewise; modified
     */
    public void echoes(double[] t1Ms, double[] t2Ms, double[] b1, int count, double[] outRe, double[] outIm) {
        if (count < 1 || count > LANES) {
            throw new IllegalArgumentException("count must be within [1, " + LANES + "], got " + count);
        }
        Work w = work.get();
        if (realTrain != null) {
            for (int l = 0; l < count; l++) {
                if (!(b1[l] > 0) || b1[l] > b1Max * (1 + 1e-12)) {
                    throw new IllegalArgumentException("b1 must be within (0, " + b1Max + "], got " + b1[l]);
                }
                w.t1[l] = t1Ms[l];
                w.t2[l] = t2Ms[l];
                w.b1[l] = b1[l];
            }
            real(w, count, outRe, outIm);
            return;
        }
        for (int l = 0; l < count; l++) {
            echoes(t1Ms[l], t2Ms[l], b1[l], w.re1, w.im1);
            System.arraycopy(w.re1, 0, outRe, l * echoes, echoes);
            System.arraycopy(w.im1, 0, outIm, l * echoes, echoes);
        }
    }

    private void real(Work w, int count, double[] outRe, double[] outIm) {
        (count == 1 ? w.single : w.steady).run(realTrain, dPre, dPost, dZ, repetitionMs, w.t1, w.t2, w.b1, count, w.out);
        double psi = Math.toRadians(realTrain.excitationPhaseDeg() - 90.0);
        double c = Math.cos(psi);
        double s = Math.sin(psi);
        int m = count * echoes;
        for (int i = 0; i < m; i++) {
            double v = w.out[i];
            outRe[i] = v * c;
            outIm[i] = v * s;
        }
    }

    /**
     * The acquisition as a sum of trains of ideal pulses, one per slice position (both sides of the
     * slice listed), for pathway analysis: see {@link LocalTrain}. Rotations are Bloch-simulated directly
     * (no tables). Diffusion is not representable this way.
     *
     * @param t1Ms T1 in ms
     * @param t2Ms T2 in ms
     * @param b1 B1 scale
     * @return the local trains (one for a non-selective protocol)
     * @throws IllegalStateException if the protocol has diffusion
     */
    public java.util.List<LocalTrain> localTrains(double t1Ms, double t2Ms, double b1) {
        for (double d : dPre) {
            if (d != 1.0) {
                throw new IllegalStateException("diffusion cannot be written as trains of ideal pulses");
            }
        }
        Work w = work.get();
        double e2h = Math.exp(-0.5 * espMs / t2Ms);
        double e1h = Math.exp(-0.5 * espMs / t1Ms);
        double eRec = Double.isFinite(repetitionMs) ? Math.exp(-(repetitionMs - echoes * espMs) / t1Ms) : 0;
        java.util.List<LocalTrain> out = new ArrayList<>();
        double[] excSteps = selective ? PulseRotation.steps(excEnvelope, PulseRotation.STEPS) : null;
        double[] refSteps = selective ? PulseRotation.steps(refEnvelope, PulseRotation.STEPS) : null;
        int positions = positions();
        double[][] kindRot = new double[kindFlipRad.length][4];
        double[] exc = new double[4];
        for (int i = 0; i < positions; i++) {
            int sides = selective && grid.halfLine() && i > 0 ? 2 : 1;
            for (int side = 0; side < sides; side++) {
                double sign = side == 0 ? 1 : -1;
                double weight = selective ? (grid.halfLine() ? grid.weights()[i] / sides : grid.weights()[i]) : 1.0;
                if (selective) {
                    PulseRotation.centre(excSteps, b1 * excFlipRad, sign * grid.excitationFreq()[i], exc);
                } else {
                    ideal(b1 * excFlipRad, exc);
                }
                phase(exc, excPhaseRad + frameRad);
                for (int k = 0; k < kindFlipRad.length; k++) {
                    if (selective) {
                        PulseRotation.centre(refSteps, b1 * kindFlipRad[k], sign * grid.refocusingFreq()[i], kindRot[k]);
                    } else {
                        ideal(b1 * kindFlipRad[k], kindRot[k]);
                    }
                    phase(kindRot[k], kindPhaseRad[k] + frameRad);
                    TrainKernel.coefficients(kindRot[k][0], kindRot[k][1], kindRot[k][2], kindRot[k][3], w.coef, 18 * k);
                }
                double m = 1;
                if (eRec > 0) {
                    double z0 = exc[0] * exc[0] + exc[1] * exc[1] - exc[2] * exc[2] - exc[3] * exc[3];
                    double a = w.kernel.run(w.coef, kindOf, false, 0, 0, z0, false, e2h, e1h, 0, null, null);
                    double b = w.kernel.run(w.coef, kindOf, false, 0, 0, 0, true, e2h, e1h, 0, null, null);
                    m = (b * eRec + 1 - eRec) / (1 - a * eRec);
                }
                double[] flips = new double[echoes];
                double[] phases = new double[echoes];
                double[] psi = new double[echoes];
                double chiE = -Math.atan2(exc[1], exc[0]);
                double acc = chiE;
                for (int p = 0; p < echoes; p++) {
                    double[] r = kindRot[kindOf[p]];
                    double chi = -Math.atan2(r[1], r[0]);
                    flips[p] = Math.toDegrees(2 * Math.atan2(Math.hypot(r[2], r[3]), Math.hypot(r[0], r[1])));
                    phases[p] = Math.toDegrees(Math.atan2(r[3], r[2]) + 0.5 * Math.PI - chi - acc);
                    acc += 2 * chi;
                    psi[p] = acc;
                }
                double excFlip = Math.toDegrees(2 * Math.atan2(Math.hypot(exc[2], exc[3]), Math.hypot(exc[0], exc[1])));
                double excPhase = Math.toDegrees(Math.atan2(exc[3], exc[2]) + 0.5 * Math.PI);
                out.add(new LocalTrain(weight * m, excFlip, excPhase, flips, phases, psi));
            }
        }
        return out;
    }

    private static void ideal(double flipRad, double[] r) {
        r[0] = Math.cos(0.5 * flipRad);
        r[1] = 0;
        r[2] = 0;
        r[3] = -Math.sin(0.5 * flipRad);
    }

    /** Multiplies b by exp(i phase). */
    private static void phase(double[] r, double phaseRad) {
        if (phaseRad == 0) {
            return;
        }
        double c = Math.cos(phaseRad);
        double s = Math.sin(phaseRad);
        double br = r[2];
        double bi = r[3];
        r[2] = br * c - bi * s;
        r[3] = br * s + bi * c;
    }

    private void interpolate(double[] table, int position, double amp, double[] r) {
        double x = amp / gridStep;
        int g = (int) Math.floor(x);
        g = Math.max(1, Math.min(gridPoints - 3, g));
        double t = x - g; // nodes at g-1, g, g+1, g+2 -> t = -1, 0, 1, 2
        double l0 = -t * (t - 1) * (t - 2) / 6;
        double l1 = (t + 1) * (t - 1) * (t - 2) / 2;
        double l2 = -(t + 1) * t * (t - 2) / 2;
        double l3 = (t + 1) * t * (t - 1) / 6;
        int o = ((position * gridPoints) + g - 1) * 4;
        for (int c = 0; c < 4; c++) {
            r[c] = l0 * table[o + c] + l1 * table[o + 4 + c] + l2 * table[o + 8 + c] + l3 * table[o + 12 + c];
        }
    }

    private static final class Work {
        final TrainKernel kernel;
        final double[] coef;
        final double[] rot = new double[4];
        final double[] im2;
        final double[] re1;
        final double[] im1;
        final SteadyCpmgEngine steady = new SteadyCpmgEngine(LANES);
        final SteadyCpmgEngine single = new SteadyCpmgEngine(1);
        final double[] t1 = new double[LANES];
        final double[] t2 = new double[LANES];
        final double[] b1 = new double[LANES];
        final double[] out;

        Work(int echoes, int kinds, int positions, double[] dPre, double[] dPost, double[] dZ) {
            kernel = new TrainKernel(echoes, dPre, dPost, dZ);
            coef = new double[18 * kinds];
            im2 = new double[echoes];
            re1 = new double[echoes];
            im1 = new double[echoes];
            out = new double[LANES * echoes];
        }
    }
}
