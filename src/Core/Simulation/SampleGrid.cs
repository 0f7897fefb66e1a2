namespace Patchproof.Core.Simulation;

/// <summary>Builds the sample times requested in <see cref="DormandPrince45"/>.</summary>
internal static class SampleGrid
{
    /// <summary>The sample times, or null when none were requested.</summary>
    /// <exception cref="ArgumentOutOfRangeException">When explicit times are not monotone in the direction of integration or leave the interval.</exception>
    public static double[]? Build(DormandPrince45 options, double startTime, double endTime)
    {
        var direction = endTime >= startTime ? 1.0 : -1.0;
        if (!options.SampleTimes.IsDefaultOrEmpty)
        {
            var times = options.SampleTimes.ToArray();
            for (var i = 0; i < times.Length; i++)
            {
                Preconditions.CheckArgumentRange(nameof(options.SampleTimes),
                    double.IsFinite(times[i]) && direction * (times[i] - startTime) >= 0 && direction * (times[i] - endTime) <= 0,
                    "must lie inside the integration interval");
                Preconditions.CheckArgumentRange(nameof(options.SampleTimes), i == 0 || direction * (times[i] - times[i - 1]) >= 0,
                    "must be monotone in the direction of integration");
            }

            return times;
        }

        if (options.SampleInterval <= 0)
        {
            return null;
        }

        var span = Math.Abs(endTime - startTime);
        // Implementation note: a relative slack of 1e-12 keeps the end time as a sample when the span
        // is a whole number of intervals that rounding put a hair short.
        var count = (long)Math.Floor((span / options.SampleInterval) * (1 + 1e-12)) + 1;
        Preconditions.CheckArgumentRange(nameof(options.SampleInterval), count <= 100_000_000, "gives more than 100 million samples");
        var grid = new double[count];
        for (var k = 0; k < count; k++)
        {
            var time = startTime + (direction * k * options.SampleInterval);
            grid[k] = direction * (time - endTime) > 0 ? endTime : time;
        }

        return grid;
    }
}
