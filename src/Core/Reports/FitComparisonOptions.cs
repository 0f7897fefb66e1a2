namespace Patchproof.Core.Reports;

/// <summary>Settings of the comparison of a capture with its fitted and nominal design (see <see cref="FitComparisonBuilder"/>).</summary>
public sealed record FitComparisonOptions
{
    /// <summary>Relative and absolute tolerance of the overlay, horizon and free-running simulations (default 1e-8).</summary>
    public double SimulationTolerance { get; init; } = 1e-8;

    /// <summary>Time between overlay restarts in Lyapunov times of the fitted design (default 0.5).</summary>
    public double RestartLyapunovTimes { get; init; } = 0.5;

    /// <summary>Problem time units the Lyapunov spectra are averaged over (default 1000; λ₁ of Lorenz then scatters by about 0.01).</summary>
    public double LyapunovProblemUnits { get; init; } = 1000;

    /// <summary>Problem time units run first and discarded before the spectra are averaged (default 20; the start is already on the capture's orbit).</summary>
    public double LyapunovTransientProblemUnits { get; init; } = 20;

    /// <summary>Tolerance of the variational solves (default 1e-7).</summary>
    public double LyapunovTolerance { get; init; } = 1e-7;

    /// <summary>Restarts of the predictability horizon, spread along the record (default 20).</summary>
    public int HorizonRestarts { get; init; } = 20;

    /// <summary>The horizon's band in channel standard deviations (default 0.25).</summary>
    public double HorizonBandStandardDeviations { get; init; } = 0.25;

    /// <summary>The longest horizon looked for, in problem time units (default 20; at most half the record is used).</summary>
    public double HorizonMaximumProblemUnits { get; init; } = 20;

    /// <summary>The variable whose successive maxima form the return map; null to choose the recorded variable with the most single-valued map.</summary>
    public string? ReturnMapVariable { get; init; }

    /// <summary>The variable whose sign names the lobe; null to take the first recorded variable whose capture is two-lobed about 0 V.</summary>
    public string? LobeVariable { get; init; }

    /// <summary>Told each part as it finishes, with the share of the comparison done; null for none. Reports arrive on the
    /// thread that called <see cref="FitComparisonBuilder.Build"/>.</summary>
    public IProgress<FitComparisonProgress>? Progress { get; init; }

    /// <summary>Checked between the parts and inside the long ones (the Lyapunov spectra per interval, the correlation sums
    /// every 16 reference points, Rosenstein's searches every 1024 points, Welch every 16 segments, the simulations every
    /// 1024 steps): once cancelled, the comparison stops with <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }
}

/// <summary>How far the comparison has come.</summary>
/// <param name="Fraction">Share of the comparison's work done, 0 to 1 (the finished parts weighted by their usual cost); never decreases.</param>
/// <param name="Stage">The part that just finished, in words, for example "correlation dimension of the capture done (5 of 12 parts)".</param>
public sealed record FitComparisonProgress(double Fraction, string Stage);
