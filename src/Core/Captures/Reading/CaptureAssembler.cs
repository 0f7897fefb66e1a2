using System.Globalization;

namespace Patchproof.Core.Captures.Reading;

/// <summary>Puts the files of one capture together: checks their time bases agree, applies units and probe factors.</summary>
/// <remarks>
/// Files merge when they hold the same number of samples and their time bases agree: equal intervals to
/// 1e-6 relative and starts within half an interval (uniform), or every explicit time within half the typical
/// interval. A channel name used in two files gets the file's name in front ("b.csv:CH1").
/// </remarks>
internal static class CaptureAssembler
{
    public static ParseResult<Capture> Assemble(IReadOnlyList<RawCapture> files, CaptureReadOptions options)
    {
        var notes = files.SelectMany(f => f.Notes).ToList();
        var first = files[0];
        for (var k = 1; k < files.Count; k++)
        {
            var other = files[k];
            if (Disagreement(first, other) is { } problem)
            {
                return ParseResult<Capture>.ForErrors([SourceDiagnostic.ErrorAt(other.File, 0, 0, problem)], notes);
            }
        }

        var raw = new List<RawChannel>();
        var duplicateNames = files.SelectMany(f => f.Channels).GroupBy(c => c.Name, StringComparer.OrdinalIgnoreCase).Where(g => g.Count() > 1).Select(g => g.Key).ToHashSet(StringComparer.OrdinalIgnoreCase);
        foreach (var f in files)
        {
            foreach (var c in f.Channels)
            {
                raw.Add(duplicateNames.Contains(c.Name) ? c with { Name = $"{Path.GetFileName(f.File) ?? "input"}:{c.Name}" } : c);
            }
        }

        if (raw.Select(c => c.Name).Distinct(StringComparer.OrdinalIgnoreCase).Count() != raw.Count)
        {
            for (var i = 0; i < raw.Count; i++)
            {
                raw[i] = raw[i] with { Name = $"{raw[i].Name}#{i + 1}" };
            }
        }

        var keyProblem = UnknownKey(options.ProbeFactors.Keys, raw, "probe factor") ?? UnknownKey(options.ChannelUnits.Keys, raw, "unit");
        if (keyProblem is not null)
        {
            return ParseResult<Capture>.ForErrors([SourceDiagnostic.ErrorAt(null, 0, 0, keyProblem)], notes);
        }

        var channels = new List<CaptureChannel>();
        for (var i = 0; i < raw.Count; i++)
        {
            var c = raw[i];
            var given = TryLookup(options.ChannelUnits, c, i, out var unitGiven) ? unitGiven : null;
            double? probe = TryLookup(options.ProbeFactors, c, i, out var probeGiven) ? probeGiven : null;
            if (probe is { } p && !(double.IsFinite(p) && p > 0))
            {
                return ParseResult<Capture>.ForErrors([SourceDiagnostic.ErrorAt(null, 0, 0, $"The probe factor for {c.Name} must be a number greater than 0, not {p.ToString(CultureInfo.InvariantCulture)}.")], notes);
            }

            double factor;
            string unit;
            if (given is not null)
            {
                if (Units.VoltsPer(given) is not { } g)
                {
                    return ParseResult<Capture>.ForErrors([SourceDiagnostic.ErrorAt(null, 0, 0, $"'{given}' given for {c.Name} is not a voltage unit (V, mV, uV, kV).")], notes);
                }

                if (c.Unit is not null && Units.VoltsPer(c.Unit) != g)
                {
                    notes.Add(SourceDiagnostic.WarningAt(c.SourceFile, c.UnitLine, 0, $"{c.Name}: the file says '{c.Unit}', you gave '{given}'; yours is used."));
                }

                factor = g;
                unit = "V";
            }
            else if (c.Unit is null)
            {
                notes.Add(new SourceDiagnostic(DiagnosticSeverity.Info, c.SourceFile, c.UnitLine, 0, $"{c.Name} gives no unit: taken as volts (state its unit if it is not)."));
                factor = 1;
                unit = "V";
            }
            else if (Units.VoltsPer(c.Unit) is { } v)
            {
                factor = v;
                unit = "V";
            }
            else
            {
                notes.Add(SourceDiagnostic.WarningAt(c.SourceFile, c.UnitLine, 0, $"{c.Name} is in '{c.Unit}', which is not a voltage: its values are kept as they are."));
                factor = 1;
                unit = c.Unit;
            }

            if (probe is { } pf && pf != 1)
            {
                notes.Add(new SourceDiagnostic(DiagnosticSeverity.Info, c.SourceFile, 0, 0, $"{c.Name}: multiplied by the probe factor {pf.ToString("G6", CultureInfo.InvariantCulture)} you gave."));
                factor *= pf;
            }

            if (factor != 1)
            {
                var samples = c.Samples.Span;
                for (var s = 0; s < samples.Length; s++)
                {
                    samples[s] = (float)(samples[s] * factor);
                }
            }

            channels.Add(new CaptureChannel(c.Name, unit, c.Samples, c.SourceFile, c.SourceColumn, probe ?? 1));
        }

        var metadata = files.SelectMany(f => f.Metadata).ToArray();
        return ParseResult<Capture>.ForValue(new Capture(first.TimeBase, channels, metadata), notes);
    }

    private static string? Disagreement(RawCapture a, RawCapture b)
    {
        var ta = a.TimeBase;
        var tb = b.TimeBase;
        var nameA = a.File ?? "the first input";
        var nameB = b.File ?? "this input";
        if (ta.SampleCount != tb.SampleCount)
        {
            return $"{nameB} holds {tb.SampleCount} samples but {nameA} holds {ta.SampleCount}: channel files must come from one acquisition.";
        }

        var dtA = ta.TypicalIntervalSeconds;
        var dtB = tb.TypicalIntervalSeconds;
        if (ta is UniformTimeBase ua && tb is UniformTimeBase ub)
        {
            if (Math.Abs(ua.IntervalSeconds - ub.IntervalSeconds) > 1e-6 * ua.IntervalSeconds)
            {
                return $"{nameB} samples every {TimeBaseBuilder.Seconds(ub.IntervalSeconds)} but {nameA} every {TimeBaseBuilder.Seconds(ua.IntervalSeconds)}: the sample rates differ.";
            }

            return Math.Abs(ua.StartSeconds - ub.StartSeconds) > 0.5 * ua.IntervalSeconds
                ? $"{nameB} starts at {TimeBaseBuilder.Seconds(ub.StartSeconds)} but {nameA} at {TimeBaseBuilder.Seconds(ua.StartSeconds)}: the files are not one acquisition."
                : null;
        }

        if (Math.Abs(dtA - dtB) > 1e-3 * Math.Abs(dtA))
        {
            return $"{nameB} samples every {TimeBaseBuilder.Seconds(dtB)} but {nameA} every {TimeBaseBuilder.Seconds(dtA)}: the sample rates differ.";
        }

        for (var i = 0; i < ta.SampleCount; i++)
        {
            if (Math.Abs(ta.TimeAtSeconds(i) - tb.TimeAtSeconds(i)) > 0.5 * dtA)
            {
                return $"Sample {i + 1} is at {TimeBaseBuilder.Seconds(tb.TimeAtSeconds(i))} in {nameB} but at {TimeBaseBuilder.Seconds(ta.TimeAtSeconds(i))} in {nameA}: the time bases disagree.";
            }
        }

        return null;
    }

    private static string? UnknownKey(IEnumerable<string> keys, IReadOnlyList<RawChannel> channels, string what)
    {
        foreach (var key in keys)
        {
            if (!channels.Where((c, i) => Matches(key, c, i)).Any())
            {
                return $"A {what} is given for '{key}', but the capture has no such channel; its channels are {string.Join(", ", channels.Select(c => c.Name))}.";
            }
        }

        return null;
    }

    private static bool TryLookup<T>(IReadOnlyDictionary<string, T> byKey, RawChannel channel, int index, out T value)
    {
        foreach (var (key, v) in byKey)
        {
            if (Matches(key, channel, index))
            {
                value = v;
                return true;
            }
        }

        value = default!;
        return false;
    }

    private static bool Matches(string key, RawChannel channel, int index) =>
        string.Equals(key.Trim(), channel.Name, StringComparison.OrdinalIgnoreCase)
        || (int.TryParse(key, NumberStyles.None, CultureInfo.InvariantCulture, out var position) && position == index + 1);
}
