using System.Globalization;

namespace Patchproof.Core.Captures.Reading;

/// <summary>Decides a file's time base: uniform when the stamps are evenly spaced within their printed resolution, explicit otherwise.</summary>
/// <remarks>
/// With a time column of N stamps t_i (in seconds), the fitted interval is dt = (t_{N-1} - t_0) / (N - 1). The
/// time base is uniform when every |t_i - (t_0 + i dt)| is at most the weight of the last printed digit
/// (rounding of each stamp, plus the rounding of the last stamp carried into dt, plus a few ulps): the file cannot say more. Stamps printed with too few digits repeat (with %.6e, seven
/// significant digits cannot resolve a 2 µs step once t passes 10 s); a uniform fit then rebuilds the time
/// base, from the metadata's sample interval when it agrees with dt to 0.1 %, otherwise from dt, and a note
/// says so. Without a time column the metadata's interval (or rate) and start time (default 0) are used.
/// </remarks>
internal static class TimeBaseBuilder
{
    private const double MetadataAgreement = 1e-3;

    public static ParseResult<TimeBase> Build(
        Memory<double>? timesInFileUnits,
        int quantumExponent,
        double secondsPerUnit,
        (double Seconds, MetadataEntry Entry)? interval,
        double? startSeconds,
        int rowCount,
        int firstDataLine,
        string? file,
        List<SourceDiagnostic> notes)
    {
        if (timesInFileUnits is not { } memory)
        {
            var (dt, entry) = interval!.Value;
            notes.Add(new SourceDiagnostic(DiagnosticSeverity.Info, file, entry.Line, 0,
                $"No time column: samples are {Seconds(dt)} apart, from the metadata's '{entry.Key}', starting at {Seconds(startSeconds ?? 0)}{(startSeconds is null ? " (no start time given)" : string.Empty)}."));
            return ParseResult<TimeBase>.ForValue(new UniformTimeBase(startSeconds ?? 0, dt, rowCount));
        }

        var times = memory.Span;
        if (secondsPerUnit != 1)
        {
            for (var i = 0; i < times.Length; i++)
            {
                times[i] *= secondsPerUnit;
            }
        }

        if (times.Length == 1)
        {
            return ParseResult<TimeBase>.ForValue(interval is { } one
                ? new UniformTimeBase(times[0], one.Seconds, 1)
                : new ExplicitTimeBase(memory));
        }

        var t0 = times[0];
        var span = times[^1] - t0;
        if (!(span > 0))
        {
            return ParseResult<TimeBase>.ForError(SourceDiagnostic.ErrorAt(file, firstDataLine, 0,
                $"Every row has the same time ({Seconds(t0)}): the time column does not advance."));
        }

        var n = times.Length;
        var fitted = span / (n - 1);
        var quantum = quantumExponent == int.MinValue ? 0 : Math.Pow(10, quantumExponent) * secondsPerUnit;
        var maxResidual = 0.0;
        var repeats = 0;
        var firstRepeat = -1;
        for (var i = 0; i < n; i++)
        {
            var residual = Math.Abs(times[i] - (t0 + (i * fitted)));
            if (residual > maxResidual)
            {
                maxResidual = residual;
            }

            if (i > 0 && times[i] == times[i - 1])
            {
                repeats++;
                if (firstRepeat < 0)
                {
                    firstRepeat = i;
                }
            }
        }

        var scale = Math.Max(Math.Abs(t0), Math.Abs(times[^1]));
        var tolerance = (quantum * (1 + 1e-9)) + (8 * Math.BitIncrement(scale) - 8 * scale) + (1e-9 * fitted);
        var uniform = maxResidual <= tolerance;
        var intervalSeconds = fitted;
        var source = "the first and last time stamps";
        if (interval is { } meta)
        {
            if (Math.Abs(meta.Seconds - fitted) <= MetadataAgreement * fitted)
            {
                intervalSeconds = meta.Seconds;
                source = $"the metadata's '{meta.Entry.Key}'";
            }
            else
            {
                notes.Add(SourceDiagnostic.WarningAt(file, meta.Entry.Line, 0,
                    $"The metadata's '{meta.Entry.Key}' says {Seconds(meta.Seconds)}, but the time column advances {Seconds(fitted)} per row; the time column is used."));
            }
        }

        if (!uniform)
        {
            if (repeats > 0)
            {
                notes.Add(SourceDiagnostic.WarningAt(file, 0, 0,
                    $"{repeats} time stamps repeat the one before (first at data row {firstRepeat + 1}), and the stamps are not evenly spaced: kept as they are."));
            }

            return ParseResult<TimeBase>.ForValue(new ExplicitTimeBase(memory));
        }

        if (repeats > 0)
        {
            notes.Add(SourceDiagnostic.WarningAt(file, 0, 0,
                $"{repeats} time stamps repeat the one before (first at data row {firstRepeat + 1}): the file prints too few digits to resolve a {Seconds(intervalSeconds)} step. " +
                $"Rebuilt an even time base of {Seconds(intervalSeconds)} from {source}."));
        }

        return ParseResult<TimeBase>.ForValue(new UniformTimeBase(t0, intervalSeconds, n));
    }

    /// <summary>A time with a readable unit: 2 µs, 1.5 ms, 20 s.</summary>
    public static string Seconds(double seconds)
    {
        var a = Math.Abs(seconds);
        var (value, unit) = a == 0 ? (0.0, "s")
            : a < 1e-6 ? (seconds * 1e9, "ns")
            : a < 1e-3 ? (seconds * 1e6, "µs")
            : a < 1 ? (seconds * 1e3, "ms")
            : (seconds, "s");
        return value.ToString("G6", CultureInfo.InvariantCulture) + " " + unit;
    }
}
