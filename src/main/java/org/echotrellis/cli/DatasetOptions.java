package org.echotrellis.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.Optional;

import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.fit.FitModel;
import org.echotrellis.fit.spectrum.SpectrumChoices;
import org.echotrellis.fit.volume.FitOptions;
import org.echotrellis.io.bids.BidsImages;
import org.echotrellis.sequence.ProtocolText;
import picocli.CommandLine.Option;

/**
 * The analysis options of the dataset commands ({@code bids}, {@code cohort}): which analyses, the
 * protocol supplying what sidecars cannot, the mask, and the fit and spectrum settings. The fit keeps
 * the option names of {@code fit}; the spectrum's T2 grid, whose names would clash, is
 * {@code --spectrum-t2-min-ms}/{@code --spectrum-t2-max-ms}. Each collection's protocol supplies the
 * defaults left open (spectrum grid from its echo times, T1 of its tissue).
 */
final class DatasetOptions {
    @Option(names = "--analysis", paramLabel = "A", defaultValue = "fit",
            description = "fit (T2map, M0map, TB1map), spectrum (MWFmap) or both (default: ${DEFAULT-VALUE}).")
    Analysis analysis;

    @Option(names = "--protocol", paramLabel = "FILE",
            description = "Protocol file for what sidecars cannot give (pulses, slice, crushers, tissue); values "
                    + "given by both must agree.")
    Path protocol;

    @Option(names = "--mask", paramLabel = "mask|PATTERN",
            description = "Voxels to fit: 'mask' (the collection's *_mask.nii[.gz] in its anat/ folder, e.g. "
                    + "sub-01_desc-brain_mask) or a path below BIDS_DIR with {sub} and {ses} placeholders; "
                    + "a collection without its mask fails. Default: every voxel.")
    String mask;

    @Option(names = "--outside-mask-value", paramLabel = "V", defaultValue = "nan",
            description = "Value of the maps outside the mask: nan or a number such as 0 (default: ${DEFAULT-VALUE}).")
    String outsideMask;

    @Option(names = "--model", paramLabel = "MODEL", defaultValue = "epg",
            description = "fit: epg or mono (default: ${DEFAULT-VALUE}).")
    FitModel model;

    @Option(names = "--t1-ms", paramLabel = "MS",
            description = "Fixed T1 in ms of the fit and the spectrum basis (default: T1 of the protocol's tissue).")
    Double t1Ms;

    @Option(names = "--t2-min-ms", paramLabel = "MS", defaultValue = "1",
            description = "fit: lower T2 bound (default: ${DEFAULT-VALUE}).")
    double t2MinMs;

    @Option(names = "--t2-max-ms", paramLabel = "MS", defaultValue = "5000",
            description = "fit: upper T2 bound (default: ${DEFAULT-VALUE}).")
    double t2MaxMs;

    @Option(names = "--b1-min", paramLabel = "SCALE", defaultValue = "0.3",
            description = "fit: lower B1 bound (default: ${DEFAULT-VALUE}).")
    double b1Min;

    @Option(names = "--b1-max", paramLabel = "SCALE", defaultValue = "1.7",
            description = "fit: upper B1 bound before folding (default: ${DEFAULT-VALUE}).")
    double b1Max;

    @Option(names = "--noise-sigma", paramLabel = "S",
            description = "fit: channel noise sigma (signal units) for the Rician mean model, or 'auto' (from the "
                    + "voxels outside --mask).")
    String noiseSigma;

    @Option(names = "--mono-offset", description = "fit: a constant offset in the mono-exponential model.")
    boolean monoOffset;

    @Option(names = "--mono-skip-first", description = "fit: drop the first echo in the mono-exponential model.")
    boolean monoSkipFirst;

    @Option(names = "--spectrum-t2-min-ms", paramLabel = "MS",
            description = "spectrum: shortest T2 of the grid (default: each protocol's first echo time).")
    Double spectrumT2MinMs;

    @Option(names = "--spectrum-t2-max-ms", paramLabel = "MS",
            description = "spectrum: longest T2 of the grid (default: 4 x each protocol's last echo time).")
    Double spectrumT2MaxMs;

    @Option(names = "--t2-bins", paramLabel = "N", description = "spectrum: log-spaced grid points (default: 15 per decade).")
    Integer t2Bins;

    @Option(names = "--regularisation", paramLabel = "METHOD", defaultValue = "misfit",
            description = "spectrum: misfit, cross-validation or none (default: ${DEFAULT-VALUE}).")
    String regularisation;

    @Option(names = "--misfit-increase", paramLabel = "FACTOR",
            description = "spectrum: regularised / unregularised misfit (default: 1 + 1/(4 echoes)).")
    Double misfitIncrease;

    @Option(names = "--refocus-search-deg", paramLabel = "LO:HI:COUNT",
            description = "spectrum: coarse refocusing angles bracketing the search (default: from each protocol).")
    String refocusSearch;

    @Option(names = "--refocus-deg", paramLabel = "DEG", description = "spectrum: this refocusing angle instead of searching.")
    Double refocusDeg;

    @Option(names = "--fraction-window-ms", paramLabel = "LO:HI",
            description = "spectrum: T2 window of the MWFmap (default: each protocol's short-T2 window, shortest grid T2 "
                    + "to 40 ms).")
    String window;

    /** What to compute. */
    enum Analysis { fit, spectrum, both }

    /** @return the fit settings, or empty for a spectrum-only run (validated; errors name options) */
    Optional<FitOptions> fit() {
        if (analysis == Analysis.spectrum) {
            return Optional.empty();
        }
        double t1 = t1Ms != null ? CliChecks.positiveOrInf("--t1-ms", t1Ms) : Double.NaN;
        FitOptions o = CliChecks.asOptions(() -> new FitOptions(model, t1, t2MinMs, t2MaxMs, b1Min, b1Max, true,
                Double.NaN, false, monoOffset, monoSkipFirst, false));
        if (noiseSigma != null) {
            if (noiseSigma.equals("auto") && mask == null) {
                throw new InputException("--noise-sigma auto estimates the noise outside --mask; give --mask or a number");
            }
            o = noiseSigma.equals("auto") ? o.withNoise(Double.NaN, true) : o.withNoise(FitCommand.parseSigma(noiseSigma), false);
        }
        return Optional.of(o);
    }

    /** @return the spectrum choices (each protocol resolves the rest), or empty for a fit-only run */
    Optional<SpectrumChoices> spectrum() {
        if (analysis == Analysis.fit) {
            return Optional.empty();
        }
        return Optional.of(CliChecks.spectrumChoices(t1Ms, window == null ? List.of() : List.of(window),
                spectrumT2MinMs != null ? Checks.positive("--spectrum-t2-min-ms", spectrumT2MinMs, null) : null,
                spectrumT2MaxMs != null ? Checks.positive("--spectrum-t2-max-ms", spectrumT2MaxMs, null) : null,
                t2Bins, regularisation,
                misfitIncrease != null ? Checks.inRange("--misfit-increase", misfitIncrease, 1.0, 10.0, null) : null,
                refocusSearch, refocusDeg));
    }

    /** @return the protocol file's text (parsed once to check it), if given */
    Optional<ProtocolText> protocolText() {
        Optional<ProtocolText> t = Optional.ofNullable(protocol).map(ProtocolText::read);
        t.ifPresent(ProtocolText::parse);
        return t;
    }

    /** @return the mask choice ({@value BidsImages#MASK} or a pattern), or null; blank values refused */
    String maskChoice() {
        if (mask != null && mask.isBlank()) {
            throw new InputException("--mask must be 'mask' or a file pattern below BIDS_DIR, got an empty value");
        }
        return mask;
    }

    /** @return the value written outside the mask */
    float outsideMaskValue() {
        return CliChecks.outsideMaskValue(outsideMask);
    }
}
