using System.Collections.Immutable;
using Patchproof.Core.Models;

namespace Patchproof.Core.Dynamics;

/// <summary>Settings for <see cref="PredictabilityHorizon"/>.</summary>
public sealed record PredictabilityOptions
{
    /// <summary>How many restarts, spread evenly along the record (default 20).</summary>
    public int Restarts { get; init; } = 20;

    /// <summary>The band: the largest RMS deviation, in channel standard deviations, that still counts as following (default 0.25).</summary>
    public double BandStandardDeviations { get; init; } = 0.25;

    /// <summary>The longest horizon looked for, in the model's time unit; a restart that stays within the band this long is censored there (default 20).</summary>
    public double MaximumHorizon { get; init; } = 20;

    /// <summary>Relative and absolute tolerance of the restarted solves (default 1e-8).</summary>
    public double Tolerance { get; init; } = 1e-8;

    /// <summary>The state variables the deviation is taken over; null for all. A record whose hidden states were reconstructed scores only the recorded ones.</summary>
    public IReadOnlyList<int>? ScoredStates { get; init; }

    /// <summary>Checked before each restart and during its solve: once cancelled, the measurement stops with <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }
}

/// <summary>How long simulations restarted from the record's state stay within the band around it.</summary>
/// <param name="RestartTimes">The time of each restart, in the model's time unit.</param>
/// <param name="Horizons">Each restart's horizon, in the model's time unit (censored ones at the maximum).</param>
/// <param name="MeanHorizon">The mean horizon, in the model's time unit.</param>
/// <param name="MeanHorizonSeconds">The mean horizon in seconds (model time times the seconds per unit given).</param>
/// <param name="MeanHorizonLyapunovTimes">The mean horizon times lambda_1 (NaN when no exponent was given).</param>
/// <param name="MedianHorizon">The median horizon, in the model's time unit.</param>
/// <param name="CensoredCount">Restarts that never left the band within the maximum horizon.</param>
/// <param name="BandStandardDeviations">The band used.</param>
public sealed record PredictabilityHorizonResult(
    double[] RestartTimes,
    double[] Horizons,
    double MeanHorizon,
    double MeanHorizonSeconds,
    double MeanHorizonLyapunovTimes,
    double MedianHorizon,
    int CensoredCount,
    double BandStandardDeviations);

/// <summary>The predictability horizon of a model against a record: how long a restarted simulation follows it.</summary>
/// <remarks>
/// <para>Definition: at each of K restart samples i_k (evenly spread over the record, leaving room
/// for the maximum horizon) the model is started from the record's state and sampled on its grid.
/// The deviation is d(t) = sqrt(mean_c ((s_c(t) - r_c(t)) / sigma_c)^2), sigma_c the record's
/// standard deviation of channel c; the horizon is the first time d exceeds the band (default
/// 0.25 standard deviations). The mean over restarts is reported in the model's time unit, in
/// seconds, and in Lyapunov times (times lambda_1). For a perfect model the horizon is about
/// ln(band / d_0) / lambda_1 with d_0 the record's noise; a wrong coefficient shortens it.</para>
/// <para>The record must hold every state variable, in the model's units and order (the caller maps
/// and scales the channels). A restart whose solve fails counts with the time it reached.</para>
/// </remarks>
public static class PredictabilityHorizon
{
    /// <summary>Measures the horizon of <paramref name="system"/> with <paramref name="parameters"/> against <paramref name="reference"/>.</summary>
    /// <param name="system">The model.</param>
    /// <param name="parameters">Its parameters.</param>
    /// <param name="reference">The record, one array per state variable, equally long.</param>
    /// <param name="sampleInterval">The record's sample interval in the model's time unit, positive.</param>
    /// <param name="secondsPerTimeUnit">Seconds per model time unit (the board's time scale; 1 when the record is in model time).</param>
    /// <param name="largestExponent">lambda_1 per model time unit, or NaN when unknown.</param>
    /// <param name="options">Settings; null for the defaults.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the record does not match the system or is shorter than the maximum horizon.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="PredictabilityOptions.Cancellation"/> is cancelled.</exception>
    public static PredictabilityHorizonResult Measure(IOdeSystem system, ReadOnlySpan<double> parameters, IReadOnlyList<double[]> reference, double sampleInterval, double secondsPerTimeUnit, double largestExponent, PredictabilityOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(system);
        ArgumentNullException.ThrowIfNull(reference);
        options ??= new PredictabilityOptions();
        Preconditions.CheckArgumentRange(nameof(reference), reference.Count == system.StateCount && reference.All(channel => channel.Length == reference[0].Length), "must hold one equally long array per state variable");
        Preconditions.CheckArgumentRange(nameof(sampleInterval), sampleInterval > 0 && double.IsFinite(sampleInterval), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(secondsPerTimeUnit), secondsPerTimeUnit > 0 && double.IsFinite(secondsPerTimeUnit), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(options), options.Restarts >= 1 && options.BandStandardDeviations > 0 && options.MaximumHorizon > 0 && options.Tolerance > 0, "restarts, band, maximum horizon and tolerance must be positive");
        var horizonSamples = (int)Math.Ceiling(options.MaximumHorizon / sampleInterval) + 1;
        var n = reference[0].Length;
        Preconditions.CheckArgumentRange(nameof(reference), n > horizonSamples, "is shorter than the maximum horizon");
        var scored = options.ScoredStates is { } chosen ? chosen.ToArray() : [.. Enumerable.Range(0, system.StateCount)];
        Preconditions.CheckArgumentRange(nameof(options), scored.Length > 0 && scored.All(c => c >= 0 && c < system.StateCount), "the scored states must be valid state indices, at least one");
        var deviations = RestartedSimulation.StandardDeviations(reference);
        var parameterArray = parameters.ToArray().ToImmutableArray();
        var restarts = options.Restarts;
        var restartTimes = new double[restarts];
        var horizons = new double[restarts];
        var censored = 0;
        var span = n - horizonSamples;
        for (var k = 0; k < restarts; k++)
        {
            options.Cancellation.ThrowIfCancellationRequested();
            var start = restarts == 1 ? 0 : (int)((long)k * span / (restarts - 1));
            restartTimes[k] = start * sampleInterval;
            var simulated = RestartedSimulation.Run(system, parameterArray, reference, sampleInterval, start, horizonSamples, options.Tolerance, options.Cancellation);
            var reached = simulated[0].Length;
            var exit = -1;
            for (var j = 0; j < reached && exit < 0; j++)
            {
                var sum = 0.0;
                foreach (var c in scored)
                {
                    var e = (simulated[c][j] - reference[c][start + j]) / deviations[c];
                    sum += e * e;
                }

                if (Math.Sqrt(sum / scored.Length) > options.BandStandardDeviations || !double.IsFinite(sum))
                {
                    exit = j;
                }
            }

            if (exit < 0 && reached == horizonSamples)
            {
                censored++;
                horizons[k] = (horizonSamples - 1) * sampleInterval;
            }
            else
            {
                horizons[k] = (exit < 0 ? reached : exit) * sampleInterval;
            }
        }

        var mean = horizons.Average();
        var sorted = horizons.OrderBy(value => value).ToArray();
        var median = sorted.Length % 2 == 1 ? sorted[sorted.Length / 2] : 0.5 * (sorted[sorted.Length / 2 - 1] + sorted[sorted.Length / 2]);
        return new PredictabilityHorizonResult(restartTimes, horizons, mean, mean * secondsPerTimeUnit, double.IsFinite(largestExponent) ? mean * largestExponent : double.NaN, median, censored, options.BandStandardDeviations);
    }
}
