namespace Patchproof.Core.Diagnosis;

/// <summary>Settings of the part diagnosis; the defaults are the calibrated ones.</summary>
public sealed record DiagnosisOptions
{
    /// <summary>Prior probability that any one part (or group) is faulty, π in π^|F| (1 - π)^(N - |F|). Default 0.02.</summary>
    public double FaultPriorProbability { get; init; } = 0.02;

    /// <summary>The most parts a hypothesis frees at once. Default 2.</summary>
    public int MaxFaultsPerHypothesis { get; init; } = 2;

    /// <summary>Columns whose whitened directions have |cos| above this cannot be told apart and form a group. Default 0.999.</summary>
    public double ParallelCosine { get; init; } = 0.999;

    /// <summary>A runner-up naming other parts with a posterior above this makes the verdict "cannot decide". Default 0.1.</summary>
    public double CannotDecideRunnerUpProbability { get; init; } = 0.1;

    /// <summary>Below this chi-square p-value the winning hypothesis does not explain the rows. Default 1e-3.</summary>
    public double FitCheckPValue { get; init; } = 1e-3;

    /// <summary>An all-in-tolerance explanation with a p-value at least this is accepted before any part is named. Default 0.01.</summary>
    public double AcceptableHealthyPValue { get; init; } = 0.01;

    /// <summary>An accepted all-in-tolerance explanation with a p-value below this fits only just: the report then notes the
    /// likeliest deviating part beside the verdict. Default 0.1 (the usual 10 % significance level, common practice).</summary>
    public double BorderlineHealthyPValue { get; init; } = 0.1;

    /// <summary>A part value inside its tolerance is still reported beside a "within tolerance" verdict when the accepted
    /// all-in-tolerance explanation puts its interval at least this fraction of its band away from nominal: a wide-tolerance
    /// part that far off changes the board as a fault would. Default 0.75.</summary>
    public double FarFromNominalBandFraction { get; init; } = 0.75;

    /// <summary>How many standard deviations the interval spans on each side (2 gives about 95 %). Default 2.</summary>
    public double IntervalSigmas { get; init; } = 2;

    /// <summary>The log-gain prior sd a calibration capture gives a probe, used to say what a calibration would buy. Default 0.002
    /// (0.2 %: the calibration's own error is far smaller; what remains is the drift between the two recordings, from memory).</summary>
    public double CalibratedGainLogSd { get; init; } = 0.002;

    /// <summary>A part whose whitened column lies this close (cos²) to the span of the uncalibrated probe-gain columns can be
    /// mimicked by probe gains. Default 0.9.</summary>
    public double GainMimicCosineSquared { get; init; } = 0.9;

    /// <summary>A finding depends on the probe gains when, besides being mimicked by them, their priors make up at least this
    /// share of its posterior variance. Default 0.5.</summary>
    public double GainVarianceShare { get; init; } = 0.5;
}
