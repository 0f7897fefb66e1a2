using Patchproof.Core.Captures.Reading;

namespace Patchproof.Core.Captures.Checks;

/// <summary>Checks the time base: backwards steps, repeated and missing samples, jitter.</summary>
/// <remarks>
/// On explicit times with steps d_i = t_{i+1} - t_i and median step m: a step below 0 runs backwards (error,
/// id <c>time-base-backwards</c>); a step of 0 repeats a sample (warning, <c>time-base-repeats</c>); a step above
/// 1.5 m leaves out round(d/m) - 1 samples (warning, <c>time-base-gaps</c>); the standard deviation of the other
/// steps above 1 % of m is jitter (warning, <c>time-base-jitter</c>; 1 % is common practice, not a standard).
/// Every capture also gets an info result <c>time-base</c> with the interval, rate and duration.
/// </remarks>
public sealed class TimeBaseCheck : ICaptureCheck
{
    /// <summary>Relative jitter (standard deviation of the steps over their median) above which the check warns.</summary>
    public const double JitterLimit = 0.01;

    /// <summary>A step longer than this many median steps leaves out samples.</summary>
    public const double GapFactor = 1.5;

    /// <inheritdoc/>
    public string Id => "time-base";

    /// <inheritdoc/>
    public IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context)
    {
        ArgumentNullException.ThrowIfNull(capture);
        var tb = capture.TimeBase;
        var n = tb.SampleCount;
        var dt = tb.TypicalIntervalSeconds;
        var summary = new Dictionary<string, double>
        {
            ["sampleCount"] = n,
            ["intervalSeconds"] = dt,
            ["sampleRateHertz"] = dt > 0 ? 1 / dt : 0,
            ["durationSeconds"] = tb.DurationSeconds,
        };
        var kind = tb is UniformTimeBase ? "evenly" : "at the file's own times, typically";
        yield return new CaptureCheckResult(Id, DiagnosticSeverity.Info, null,
            $"{n} samples {kind} {TimeBaseBuilder.Seconds(dt)} apart ({CheckText.Hertz(dt > 0 ? 1 / dt : 0)}), {TimeBaseBuilder.Seconds(tb.DurationSeconds)} in all.", summary);

        if (tb is not ExplicitTimeBase explicitTimes || n < 3 || !(dt > 0))
        {
            yield break;
        }

        var t = explicitTimes.TimesSeconds.Span;
        int backwards = 0, repeats = 0, gaps = 0, firstBackwards = -1;
        long missing = 0;
        double sum = 0, squares = 0;
        var regular = 0;
        for (var i = 1; i < n; i++)
        {
            var d = t[i] - t[i - 1];
            if (d < 0)
            {
                backwards++;
                firstBackwards = firstBackwards < 0 ? i : firstBackwards;
            }
            else if (d == 0)
            {
                repeats++;
            }
            else if (d > GapFactor * dt)
            {
                gaps++;
                missing += (long)Math.Round(d / dt) - 1;
            }
            else
            {
                regular++;
                sum += d;
                squares += d * d;
            }
        }

        if (backwards > 0)
        {
            yield return new CaptureCheckResult("time-base-backwards", DiagnosticSeverity.Error, null,
                $"Time runs backwards {backwards} times (first at sample {firstBackwards + 1}): the rows are out of order or two records were joined; the capture cannot be fitted as it is.",
                new Dictionary<string, double> { ["backwardSteps"] = backwards, ["firstSample"] = firstBackwards + 1 });
        }

        if (repeats > 0)
        {
            yield return new CaptureCheckResult("time-base-repeats", DiagnosticSeverity.Warning, null,
                $"{repeats} samples repeat the time of the one before: the time stamps are too coarse or samples were duplicated.",
                new Dictionary<string, double> { ["repeatedSamples"] = repeats });
        }

        if (gaps > 0)
        {
            yield return new CaptureCheckResult("time-base-gaps", DiagnosticSeverity.Warning, null,
                $"The record has {gaps} gaps where about {missing} samples are missing: the scope dropped data or rows were removed.",
                new Dictionary<string, double> { ["gaps"] = gaps, ["missingSamples"] = missing });
        }

        if (regular > 1)
        {
            var mean = sum / regular;
            var jitter = Math.Sqrt(Math.Max(0, (squares / regular) - (mean * mean))) / dt;
            var values = new Dictionary<string, double> { ["relativeJitter"] = jitter, ["jitterSeconds"] = jitter * dt };
            yield return jitter > JitterLimit
                ? new CaptureCheckResult("time-base-jitter", DiagnosticSeverity.Warning, null,
                    $"The sample spacing wanders by {CheckText.Percent(jitter)} of the interval (rms): an uneven time base blurs derivatives; use the scope's own fixed-rate export if it has one.", values)
                : new CaptureCheckResult("time-base-jitter", DiagnosticSeverity.Info, null,
                    $"The sample spacing is even to {CheckText.Percent(jitter)} of the interval (rms).", values);
        }
    }
}
