namespace Patchproof.Core.Captures;

/// <summary>When each sample of a capture was taken, in seconds.</summary>
/// <remarks>
/// Two shapes: <see cref="UniformTimeBase"/> (a start and a fixed interval, the usual case for a scope)
/// and <see cref="ExplicitTimeBase"/> (one time per sample, kept when the file's time stamps are not
/// evenly spaced within their printed resolution). Times are in seconds from the scope's own origin
/// (often the trigger), so they may be negative.
/// </remarks>
public abstract record TimeBase
{
    /// <summary>How many samples the time base describes; at least 0.</summary>
    public abstract int SampleCount { get; }

    /// <summary>The time of one sample in seconds.</summary>
    /// <param name="index">A sample index from 0 to <see cref="SampleCount"/> - 1.</param>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="index"/> is outside the time base.</exception>
    public abstract double TimeAtSeconds(int index);

    /// <summary>The time from the first to the last sample in seconds; 0 for fewer than two samples.</summary>
    public double DurationSeconds => SampleCount < 2 ? 0 : TimeAtSeconds(SampleCount - 1) - TimeAtSeconds(0);

    /// <summary>The typical interval between samples in seconds: the fixed interval, or the median of the explicit steps.</summary>
    public abstract double TypicalIntervalSeconds { get; }
}

/// <summary>Samples taken at a fixed interval: t_i = start + i * interval.</summary>
/// <remarks>Invariants: the interval is finite and positive, the start finite, the count at least 0.</remarks>
/// <param name="StartSeconds">Time of the first sample in seconds.</param>
/// <param name="IntervalSeconds">Time between samples in seconds, greater than 0.</param>
/// <param name="SampleCount">Number of samples, at least 0.</param>
public sealed record UniformTimeBase(double StartSeconds, double IntervalSeconds, int SampleCount) : TimeBase
{
    /// <summary>Time of the first sample in seconds.</summary>
    public double StartSeconds { get; } = CheckStart(StartSeconds);

    /// <summary>Time between samples in seconds, greater than 0.</summary>
    public double IntervalSeconds { get; } = CheckInterval(IntervalSeconds);

    /// <inheritdoc/>
    public override int SampleCount { get; } = CheckCount(SampleCount);

    /// <summary>Samples per second, 1 / <see cref="IntervalSeconds"/>.</summary>
    public double SampleRateHertz => 1.0 / IntervalSeconds;

    /// <inheritdoc/>
    public override double TypicalIntervalSeconds => IntervalSeconds;

    /// <inheritdoc/>
    public override double TimeAtSeconds(int index)
    {
        Preconditions.CheckArgumentRange(nameof(index), (uint)index < (uint)SampleCount, "must index a sample of the time base");
        return StartSeconds + (index * IntervalSeconds);
    }

    private static double CheckStart(double start)
    {
        Preconditions.CheckFinite(nameof(StartSeconds), start);
        return start;
    }

    private static double CheckInterval(double interval)
    {
        Preconditions.CheckArgumentRange(nameof(IntervalSeconds), double.IsFinite(interval) && interval > 0, "must be finite and greater than 0");
        return interval;
    }

    private static int CheckCount(int count)
    {
        Preconditions.CheckArgumentRange(nameof(SampleCount), count >= 0, "must be at least 0");
        return count;
    }
}

/// <summary>One time per sample, in seconds, as the file gave them.</summary>
/// <remarks>
/// The times are finite but not required to be increasing: the reader rejects time that runs backwards,
/// while captures built in code may carry any order and the time-base check reports it.
/// The memory is shared, not copied; do not change the array behind it.
/// </remarks>
/// <param name="TimesSeconds">The time of each sample in seconds.</param>
public sealed record ExplicitTimeBase(ReadOnlyMemory<double> TimesSeconds) : TimeBase
{
    private readonly double typicalInterval = MedianStep(TimesSeconds.Span);

    /// <inheritdoc/>
    public override int SampleCount => TimesSeconds.Length;

    /// <inheritdoc/>
    public override double TypicalIntervalSeconds => typicalInterval;

    /// <inheritdoc/>
    public override double TimeAtSeconds(int index)
    {
        Preconditions.CheckArgumentRange(nameof(index), (uint)index < (uint)SampleCount, "must index a sample of the time base");
        return TimesSeconds.Span[index];
    }

    private static double MedianStep(ReadOnlySpan<double> times)
    {
        if (times.Length < 2)
        {
            return 0;
        }

        // Implementation note: a median over at most 65,537 evenly spread steps keeps this cheap on 10-million-sample captures.
        var count = Math.Min(times.Length - 1, 65_536);
        var stride = (times.Length - 1) / count;
        var steps = new double[count];
        for (var k = 0; k < count; k++)
        {
            var i = k * stride;
            steps[k] = times[i + 1] - times[i];
        }

        Array.Sort(steps);
        return steps[count / 2];
    }
}
