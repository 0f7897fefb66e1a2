namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>Settings of the multiple-shooting fit.</summary>
public sealed record MultipleShootingOptions
{
    /// <summary>The length of one shooting segment in seconds; about half a Lyapunov time of the board. Required, positive.</summary>
    public required double SegmentSeconds { get; init; }

    /// <summary>Relative tolerance of the Dormand-Prince integration inside each segment. Default 1e-8.</summary>
    public double RelativeTolerance { get; init; } = 1e-8;

    /// <summary>Absolute tolerance in volts of the integration inside each segment. Default 1e-8.</summary>
    public double AbsoluteToleranceVolts { get; init; } = 1e-8;

    /// <summary>Huber threshold in noise standard deviations (1.345 is the common choice); null fits plain least squares.</summary>
    public double? HuberThreshold { get; init; } = 1.345;

    /// <summary>How much more a continuity mismatch weighs than a sample misfit of the same size in volts. Default 100.</summary>
    public double ContinuityWeightFactor { get; init; } = 100;

    /// <summary>Prior sd of each channel offset d_c in volts, or null for none. A channel offset on a state that enters a
    /// product term trades exactly against that product's partner coefficient and the equation's offset (ESTIMATION.md
    /// section 1), so without a prior the fit has a flat direction; probe offsets of about 10 mV (common practice) make
    /// 0.02 V a fair prior when the flat direction must be pinned. Default none: the fit then follows the data along that direction and its covariance says so.</summary>
    public double? ChannelOffsetPriorSdVolts { get; init; }

    /// <summary>Whether each channel gets a fitted offset d_c. Default true.</summary>
    public bool EstimateChannelOffsets { get; init; } = true;

    /// <summary>The Levenberg-Marquardt settings. Default: at most 60 iterations, relative step 1e-9, and the statistical stop
    /// at a tenth of a standard error (tau = 0.01; the fit supplies the degrees of freedom).</summary>
    /// <remarks>Started from equation-error estimates, which sit close to the minimum, an initial damping of 1e-5 lets the
    /// first steps be Gauss-Newton steps (the default 1e-3 only slows them: each iteration cuts lambda by at most a third);
    /// the board fit sets it so. From nominal values with hidden states keep the default: light damping there lets the
    /// first steps leave the basin.</remarks>
    public LevenbergMarquardtOptions Solver { get; init; } = new() { MaxIterations = 60, RelativeStepTolerance = 1e-9, RelativeCostTolerance = 1e-12, VarianceScaledCostTolerance = 0.01 };

    /// <summary>The initial damping for a start from equation-error estimates (see <see cref="Solver"/>).</summary>
    public const double NearStartDamping = 1e-5;

    /// <summary>Gaussian priors on field parameters, for example from part tolerances. A hidden state's amplitude is not
    /// observable (scaling it rescales the coefficients that touch it), so a two-channel fit needs priors to fix that
    /// direction; a fully observed fit needs none. Default none.</summary>
    public IReadOnlyList<ParameterPrior> ParameterPriors { get; init; } = [];

    /// <summary>Integrate segments on several threads. Default true.</summary>
    public bool Parallel { get; init; } = true;
}

/// <summary>A Gaussian prior on one field parameter: (p - Mean) / Sd enters the least squares as a residual.</summary>
/// <param name="Index">The parameter's index in the field's parameter vector.</param>
/// <param name="Mean">The prior mean (the design's nominal value).</param>
/// <param name="Sd">The prior standard deviation, positive.</param>
public sealed record ParameterPrior(int Index, double Mean, double Sd);
