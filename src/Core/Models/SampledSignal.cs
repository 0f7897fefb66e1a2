namespace Patchproof.Core.Models;

/// <summary>A recorded signal for a model input: samples at increasing times, read back by linear interpolation.</summary>
/// <remarks>
/// <para>Times are in the model's time unit (problem time for a model, seconds for a board); values
/// in the input's unit. Between samples the value is interpolated linearly; before the first sample
/// it is the first value and after the last sample the last value (held, not extrapolated).</para>
/// <para>Immutable, so one signal may be read from several threads at once; <see cref="ValueAt"/>
/// allocates nothing (binary search, or direct indexing when the samples are uniform).</para>
/// </remarks>
public sealed class SampledSignal
{
    private readonly double[] times;
    private readonly double[] values;
    private readonly double inverseInterval;
    private readonly bool isUniform;

    /// <summary>A signal from its sample times and values.</summary>
    /// <param name="times">Finite, strictly increasing sample times (at least one).</param>
    /// <param name="values">Finite sample values, one per time.</param>
    /// <exception cref="ArgumentOutOfRangeException">The lengths differ, are zero, or a time or value is not finite, or the times do not increase.</exception>
    public SampledSignal(IReadOnlyList<double> times, IReadOnlyList<double> values)
    {
        Preconditions.CheckArgumentRange(nameof(times), times.Count >= 1, "needs at least one sample");
        Preconditions.CheckArgumentRange(nameof(values), values.Count == times.Count, "needs one value per time");
        this.times = [.. times];
        this.values = [.. values];
        for (var i = 0; i < this.times.Length; i++)
        {
            Preconditions.CheckFinite(nameof(times), this.times[i]);
            Preconditions.CheckFinite(nameof(values), this.values[i]);
            Preconditions.CheckArgumentRange(nameof(times), i == 0 || this.times[i] > this.times[i - 1], "sample times must increase strictly");
        }

        if (this.times.Length >= 2)
        {
            var interval = (this.times[^1] - this.times[0]) / (this.times.Length - 1);
            isUniform = true;
            for (var i = 1; i < this.times.Length && isUniform; i++)
            {
                isUniform = Math.Abs(this.times[i] - (this.times[0] + (i * interval))) <= 1e-9 * interval;
            }

            inverseInterval = 1.0 / interval;
        }
    }

    /// <summary>A signal sampled every <paramref name="interval"/> from <paramref name="startTime"/>.</summary>
    /// <param name="startTime">The time of the first sample.</param>
    /// <param name="interval">The sample interval (positive).</param>
    /// <param name="values">The samples.</param>
    /// <exception cref="ArgumentOutOfRangeException">The interval is not positive and finite, or the samples are invalid.</exception>
    public static SampledSignal Uniform(double startTime, double interval, IReadOnlyList<double> values)
    {
        Preconditions.CheckArgumentRange(nameof(interval), interval > 0 && double.IsFinite(interval), "must be positive and finite");
        return new SampledSignal([.. Enumerable.Range(0, values.Count).Select(i => startTime + (i * interval))], values);
    }

    /// <summary>The number of samples.</summary>
    public int Count => times.Length;

    /// <summary>The time of the first sample.</summary>
    public double StartTime => times[0];

    /// <summary>The time of the last sample.</summary>
    public double EndTime => times[^1];

    /// <summary>The value at <paramref name="time"/>: linear between samples, held at the ends, NaN for a NaN time.</summary>
    /// <param name="time">The time, in the signal's time unit.</param>
    public double ValueAt(double time)
    {
        var last = times.Length - 1;
        if (double.IsNaN(time))
        {
            return double.NaN;
        }

        if (time <= times[0] || last == 0)
        {
            return values[0];
        }

        if (time >= times[last])
        {
            return values[last];
        }

        int lower;
        if (isUniform)
        {
            lower = Math.Clamp((int)((time - times[0]) * inverseInterval), 0, last - 1);
            if (time < times[lower])
            {
                lower = Math.Max(lower - 1, 0);
            }
            else if (time > times[lower + 1])
            {
                lower = Math.Min(lower + 1, last - 1);
            }
        }
        else
        {
            var found = Array.BinarySearch(times, time);
            lower = found >= 0 ? Math.Min(found, last - 1) : (~found) - 1;
        }

        var fraction = (time - times[lower]) / (times[lower + 1] - times[lower]);
        return values[lower] + (fraction * (values[lower + 1] - values[lower]));
    }
}
