package org.echotrellis.sequence;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.epg.EpgProgram;

/**
 * A protocol: the event list every command works on, the tissue to simulate and a B1 scale. The
 * shorthand echo-train form keeps its {@link CpmgTrain} as well.
 *
 * @param name protocol name
 * @param description free text
 * @param tissue default tissue
 * @param b1Scale default flip-angle scale (1 = nominal)
 * @param events the event list
 * @param train the shorthand echo train, when the protocol was written in that form
 * @param source where the protocol came from (file path or "built-in")
 * @param acquisition pulse shapes, slice selection, repetition time and crushers of the shorthand train
 *     ({@link Acquisition#none()} for event lists and for trains without those keys)
 */
public record Protocol(String name, String description, Tissue tissue, double b1Scale, List<Event> events,
                       Optional<CpmgTrain> train, String source, Acquisition acquisition) {

    /** Largest number of events in a protocol. */
    public static final int MAX_EVENTS = 100_000;

    /**
     * Validates and copies.
     *
     * @param name protocol name
     * @param description free text
     * @param tissue default tissue
     * @param b1Scale default flip-angle scale (1 = nominal)
     * @param events the event list
     * @param train the shorthand echo train, when the protocol was written in that form
     * @param source where the protocol came from (file path or "built-in")
     * @param acquisition pulse shapes, slice selection, repetition time and crushers of the shorthand train
     *     ({@link Acquisition#none()} for event lists and for trains without those keys)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public Protocol {
        name = name == null ? "" : name;
        description = description == null ? "" : description;
        source = source == null ? "" : source;
        Checks.inRange("b1_scale", b1Scale, 0.0, 5.0, source);
        Checks.require(b1Scale > 0, "b1_scale must be > 0, got " + b1Scale + " (" + source + ")");
        events = List.copyOf(events);
        train = train == null ? Optional.empty() : train;
        acquisition = acquisition == null ? Acquisition.none() : acquisition;
        if (acquisition != Acquisition.none()) {
            Checks.require(train.isPresent(), "pulse shapes, slice, repetition_ms and crusher need the shorthand train form ("
                    + source + ")");
            Optional<String> problem = acquisition.timingProblem(train.get());
            Checks.require(problem.isEmpty(), problem.orElse("") + " (" + source + ")");
        }
    }

    /**
     * A protocol with the ideal acquisition ({@link Acquisition#none()}).
     *
     * @param name protocol name
     * @param description free text
     * @param tissue default tissue
     * @param b1Scale default flip scale
     * @param events the event list
     * @param train the shorthand train, if any
     * @param source origin
     */
    public Protocol(String name, String description, Tissue tissue, double b1Scale, List<Event> events,
                    Optional<CpmgTrain> train, String source) {
        this(name, description, tissue, b1Scale, events, train, source, Acquisition.none());
    }

    /**
     * Builds the protocol of a shorthand echo train: excitation, then per echo half an echo
     * spacing with one dephasing order, the refocusing pulse, another half spacing, the echo.
     *
     * @param name protocol name
     * @param description free text
     * @param tissue tissue
     * @param b1Scale flip scale
     * @param train the echo train
     * @param source origin
     * @return the protocol
     */
    public static Protocol ofTrain(String name, String description, Tissue tissue, double b1Scale, CpmgTrain train,
                                   String source) {
        return ofTrain(name, description, tissue, b1Scale, train, source, Acquisition.none());
    }

    /**
     * Builds the protocol of a shorthand echo train acquired as described by {@code acquisition}.
     *
     * @param name protocol name
     * @param description free text
     * @param tissue tissue
     * @param b1Scale flip scale
     * @param train the echo train
     * @param source origin
     * @param acquisition pulses, slice, TR and crushers
     * @return the protocol
     */
    public static Protocol ofTrain(String name, String description, Tissue tissue, double b1Scale, CpmgTrain train,
                                   String source, Acquisition acquisition) {
        Optional<RfPulse> exc = acquisition.excitationPulse();
        Optional<RfPulse> ref = acquisition.refocusingPulse();
        List<Event> ev = new ArrayList<>(1 + 4 * train.echoes());
        ev.add(new Event.Rf(train.excitationFlipDeg(), train.excitationPhaseDeg(), exc));
        double half = 0.5 * train.echoSpacingMs();
        for (int n = 0; n < train.echoes(); n++) {
            ev.add(new Event.Interval(half, 1));
            ev.add(new Event.Rf(train.refocusFlipDeg(n), train.refocusPhaseDeg(n), ref));
            ev.add(new Event.Interval(half, 1));
            ev.add(new Event.Echo("echo " + (n + 1)));
        }
        return new Protocol(name, description, tissue, b1Scale, ev, Optional.of(train), source, acquisition);
    }

    /** @return number of echo read-outs */
    public int echoCount() {
        int n = 0;
        for (Event e : events) {
            if (e instanceof Event.Echo) {
                n++;
            }
        }
        return n;
    }

    /** @return echo times in ms from the first event */
    public double[] echoTimesMs() {
        double[] t = new double[echoCount()];
        double now = 0;
        int i = 0;
        for (Event e : events) {
            if (e instanceof Event.Interval iv) {
                now += iv.durationMs();
            } else if (e instanceof Event.Echo) {
                t[i++] = now;
            }
        }
        return t;
    }

    /** @return echo labels in order (a label of the form "echo N" when none was given) */
    public List<String> echoLabels() {
        List<String> out = new ArrayList<>();
        for (Event e : events) {
            if (e instanceof Event.Echo echo) {
                out.add(echo.label().isEmpty() ? "echo " + (out.size() + 1) : echo.label());
            }
        }
        return out;
    }

    /**
     * The CPMG train this protocol is, when the fast path applies: the shorthand train, or an event
     * list of the pattern rf, then per echo [interval(d, s), rf, interval(d, s), echo] with one duration
     * d &gt; 0 and one non-zero dephasing step s throughout; and in both cases refocusing phases that satisfy
     * the CPMG relation ({@link CpmgTrain#isCpmgPhased()}).
     *
     * @return the train, or empty if the general engine is needed
     */
    public Optional<CpmgTrain> cpmg() {
        Optional<CpmgTrain> t = train.isPresent() ? train : detect();
        return t.filter(CpmgTrain::isCpmgPhased);
    }

    private Optional<CpmgTrain> detect() {
        int m = events.size();
        if (m < 5 || (m - 1) % 4 != 0 || !(events.get(0) instanceof Event.Rf exc)) {
            return Optional.empty();
        }
        int n = (m - 1) / 4;
        if (n > CpmgTrain.MAX_ECHOES) {
            return Optional.empty();
        }
        double[] flips = new double[n];
        double[] phases = new double[n];
        double d = Double.NaN;
        int s = 0;
        for (int i = 0; i < n; i++) {
            int o = 1 + 4 * i;
            if (!(events.get(o) instanceof Event.Interval a) || !(events.get(o + 1) instanceof Event.Rf r)
                    || !(events.get(o + 2) instanceof Event.Interval b) || !(events.get(o + 3) instanceof Event.Echo)) {
                return Optional.empty();
            }
            if (i == 0) {
                d = a.durationMs();
                s = a.dephasing();
            }
            if (s == 0 || !(d > 0) || a.durationMs() != d || b.durationMs() != d || a.dephasing() != s || b.dephasing() != s) {
                return Optional.empty();
            }
            flips[i] = r.flipDeg();
            phases[i] = r.phaseDeg();
        }
        return Optional.of(new CpmgTrain(n, 2 * d, exc.flipDeg(), exc.phaseDeg(), flips, phases));
    }

    /** @return the event list compiled for the general engine */
    public EpgProgram program() {
        EpgProgram.Builder b = EpgProgram.builder();
        for (Event e : events) {
            if (e instanceof Event.Rf rf) {
                b.rf(rf.flipDeg(), rf.phaseDeg());
            } else if (e instanceof Event.Interval iv) {
                b.interval(iv.durationMs(), iv.dephasing());
            } else {
                b.echo();
            }
        }
        return b.build();
    }

    /**
     * @param t the tissue to simulate (T1, T2, diffusivity)
     * @return a copy simulating another tissue
     */
    public Protocol withTissue(Tissue t) {
        return new Protocol(name, description, t, b1Scale, events, train, source, acquisition);
    }

    /**
     * @param a how the train is acquired (pulse shapes, slice, TR, crushers)
     * @return a copy acquired another way (shorthand trains only, unless {@code a} is {@link Acquisition#none()})
     * @throws org.echotrellis.InputException if {@code a} is not {@link Acquisition#none()} and the protocol is an event list, or its timing does not fit the train
     */
    public Protocol withAcquisition(Acquisition a) {
        return new Protocol(name, description, tissue, b1Scale, events, train, source, a);
    }

    /**
     * @return true if the ideal-pulse EPG of the events gives this protocol's echoes for its tissue
     *     (see {@link Acquisition#isIdealFor})
     */
    public boolean isIdealAcquisition() {
        return acquisition.isIdealFor(tissue);
    }

    /**
     * @param b1 transmit scale applied to every flip, &gt; 0 and at most 5
     * @return a copy with another B1 scale
     * @throws org.echotrellis.InputException if the scale is outside (0, 5]
     */
    public Protocol withB1Scale(double b1) {
        return new Protocol(name, description, tissue, b1, events, train, source, acquisition);
    }

    /**
     * A copy whose refocusing pulses all get the flip {@code flipDeg}; the excitation keeps its flip,
     * and the B1 scale still multiplies every pulse (so {@code --b1 0.9} with a 150&deg; refocusing
     * flip gives 135&deg; refocusing and 0.9 of the excitation). Only for protocols written as an
     * echo train with one constant refocusing flip: a schedule or an event list is refused, since
     * replacing it with one flip would silently discard what the file describes.
     *
     * @param flipDeg refocusing flip in degrees, within (0, 360]
     * @return the changed protocol
     * @throws org.echotrellis.InputException for event lists, schedules or a flip out of range
     */
    public Protocol withConstantRefocusFlipDeg(double flipDeg) {
        if (!(flipDeg > 0 && flipDeg <= 360)) {
            throw new org.echotrellis.InputException("refocusing_flip_deg must be within (0, 360], got " + flipDeg);
        }
        CpmgTrain t = train.orElseThrow(() -> new org.echotrellis.InputException("refocusing_flip_deg sets the "
                + "constant flip of an echo-train protocol, but " + source + " is an event list; edit its rf events"));
        double[] f = t.refocusFlipsDeg();
        for (double v : f) {
            if (v != f[0]) {
                throw new org.echotrellis.InputException("refocusing_flip_deg replaces a constant refocusing flip, but "
                        + source + " has a schedule (train.refocusing.flips_deg); edit the schedule instead");
            }
        }
        java.util.Arrays.fill(f, flipDeg);
        return ofTrain(name, description, tissue, b1Scale, t.withRefocusFlipsDeg(f), source);
    }
}
