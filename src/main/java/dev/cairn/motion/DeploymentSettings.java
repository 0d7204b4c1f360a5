package dev.cairn.motion;

/**
 * Settings of a ballistic deployment Monte Carlo. Body frame, SI units.
 *
 * @param release               nominal release position, m (body frame)
 * @param velocity              nominal release velocity relative to the body, m/s
 * @param count                 number of samples, at least 1
 * @param positionSigma         standard deviation of each position component, m (≥ 0)
 * @param velocitySigma         standard deviation of each velocity component, m/s (≥ 0)
 * @param restitutionNormal     normal coefficient of restitution e_n in [0, 1]
 * @param restitutionTangential tangential coefficient of restitution e_t in [0, 1]
 * @param seed                  seed of the dispersion (sample i uses a generator seeded from seed and i)
 * @param restSpeed             the lander is at rest when its speed after a bounce is below this, m/s (≥ 0)
 * @param restApex              ... or when the apex of the next hop, v_n²/(2 g_n), is below this, m (≥ 0)
 * @param timeLimit             time limit per sample, s
 * @param maxBounces            bound on bounces per sample
 */
public record DeploymentSettings(double[] release, double[] velocity, int count, double positionSigma,
                                 double velocitySigma, double restitutionNormal, double restitutionTangential,
                                 long seed, double restSpeed, double restApex, double timeLimit, int maxBounces) {
    public DeploymentSettings {
        if (release == null || release.length != 3 || velocity == null || velocity.length != 3) {
            throw new IllegalArgumentException("release position and velocity need 3 components each");
        }
        for (int i = 0; i < 3; i++) {
            if (!Double.isFinite(release[i]) || !Double.isFinite(velocity[i])) {
                throw new IllegalArgumentException("release position and velocity must be finite");
            }
        }
        release = release.clone();
        velocity = velocity.clone();
        if (count < 1) {
            throw new IllegalArgumentException("count must be at least 1, got " + count);
        }
        if (!(positionSigma >= 0 && Double.isFinite(positionSigma) && velocitySigma >= 0
            && Double.isFinite(velocitySigma))) {
            throw new IllegalArgumentException("sigmas must be finite and non-negative");
        }
        if (!(restitutionNormal >= 0 && restitutionNormal <= 1 && restitutionTangential >= 0
            && restitutionTangential <= 1)) {
            throw new IllegalArgumentException("restitution coefficients must be in [0, 1]");
        }
        if (!(restSpeed >= 0 && Double.isFinite(restSpeed) && restApex >= 0 && Double.isFinite(restApex))) {
            throw new IllegalArgumentException("rest thresholds must be finite and non-negative");
        }
        if (!(timeLimit > 0 && Double.isFinite(timeLimit))) {
            throw new IllegalArgumentException("time limit must be positive and finite");
        }
        if (maxBounces < 1) {
            throw new IllegalArgumentException("bounce limit must be at least 1");
        }
    }

    @Override
    public double[] release() {
        return release.clone();
    }

    @Override
    public double[] velocity() {
        return velocity.clone();
    }
}
