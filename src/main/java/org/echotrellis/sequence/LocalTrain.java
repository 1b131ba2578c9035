package org.echotrellis.sequence;

/**
 * The train one slice position sees, written as ideal rotations: every local pulse of an
 * acquisition, referred to its centre, is Rz(χ)&middot;R<sub>φ</sub>(θ)&middot;Rz(χ) (θ = 2 atan2(|b|, |a|),
 * χ = &minus;arg a, φ = arg b + 90&deg; from its Cayley–Klein parameters). The z-rotations commute with
 * relaxation and dephasing, so they are carried to the echoes: pulse p acts as R<sub>φ'</sub>(θ) with
 * φ' = φ &minus; χ<sub>p</sub> &minus; Ψ<sub>p&minus;1</sub>, and echo n is multiplied by e<sup>iΨ<sub>n</sub></sup>,
 * Ψ<sub>n</sub> = χ<sub>exc</sub> + 2&Sigma;<sub>p&le;n</sub>χ<sub>p</sub>. Summing weight &times; (train of these ideal
 * pulses) &times; e<sup>iΨ</sup> over the positions gives the acquisition's echoes (without diffusion).
 *
 * @param weight integration weight times the steady-state longitudinal magnetization before the excitation
 * @param excitationFlipDeg local excitation flip
 * @param excitationPhaseDeg local excitation phase
 * @param refocusFlipsDeg local refocusing flips
 * @param refocusPhasesDeg local refocusing phases φ'
 * @param echoPhaseRad Ψ<sub>n</sub> per echo
 */
public record LocalTrain(double weight, double excitationFlipDeg, double excitationPhaseDeg, double[] refocusFlipsDeg,
                         double[] refocusPhasesDeg, double[] echoPhaseRad) {

    /**
     * Copies.
     *
     * @param weight integration weight times the steady-state longitudinal magnetization before the excitation
     * @param excitationFlipDeg local excitation flip
     * @param excitationPhaseDeg local excitation phase
     * @param refocusFlipsDeg local refocusing flips
     * @param refocusPhasesDeg local refocusing phases φ'
     * @param echoPhaseRad Ψ<sub>n</sub> per echo

     */
    public LocalTrain {
        refocusFlipsDeg = refocusFlipsDeg.clone();
        refocusPhasesDeg = refocusPhasesDeg.clone();
        echoPhaseRad = echoPhaseRad.clone();
    }

    /** @return local refocusing flips (a copy) */
    @Override
    public double[] refocusFlipsDeg() {
        return refocusFlipsDeg.clone();
    }

    /** @return local refocusing phases φ' (a copy) */
    @Override
    public double[] refocusPhasesDeg() {
        return refocusPhasesDeg.clone();
    }

    /** @return Ψ<sub>n</sub> per echo (a copy) */
    @Override
    public double[] echoPhaseRad() {
        return echoPhaseRad.clone();
    }
}
