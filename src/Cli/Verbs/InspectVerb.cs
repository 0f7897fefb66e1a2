using System.CommandLine;
using System.Globalization;
using Patchproof.Core;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Checks;

namespace Patchproof.Cli.Verbs;

/// <summary><c>patchproof inspect FILE... [--probe CH=10] [--unit CH=mV] [--json]</c>: read a capture and say what is wrong with the recording.</summary>
internal static class InspectVerb
{
    public static Command Create(CliConsole console)
    {
        var files = new Argument<string[]>("files")
        {
            Description = "One CSV with every channel, or one CSV per channel of the same acquisition.",
            Arity = ArgumentArity.OneOrMore,
        };
        var probe = new Option<string[]>("--probe")
        {
            Description = "A probe factor the scope did not apply, as CHANNEL=FACTOR (CH2=10 or CH2=x10); repeat per channel.",
        };
        var unit = new Option<string[]>("--unit")
        {
            Description = "A channel's unit when the file gives none, as CHANNEL=UNIT (CH1=mV); repeat per channel.",
        };
        var json = new Option<bool>("--json") { Description = "Print the versioned JSON form (docs/captures.md) instead of the readable summary." };
        var command = new Command("inspect", "Read scope captures, show what was read and check the recording (clipping, resolution, noise, time base, sampling).");
        command.Arguments.Add(files);
        command.Options.Add(probe);
        command.Options.Add(unit);
        command.Options.Add(json);
        command.SetAction(parse => Run(
            console,
            parse.GetValue(files) ?? [],
            parse.GetValue(probe) ?? [],
            parse.GetValue(unit) ?? [],
            parse.GetValue(json)));
        return command;
    }

    private static int Run(CliConsole console, string[] files, string[] probes, string[] units, bool json)
    {
        var probeFactors = new Dictionary<string, double>(StringComparer.OrdinalIgnoreCase);
        foreach (var item in probes)
        {
            if (!TrySplit(item, out var channel, out var text) || !TryParseFactor(text, out var factor))
            {
                console.Error.WriteLine($"--probe {item}: expected CHANNEL=FACTOR with a factor above 0, for example CH2=10 or CH2=x10.");
                return PatchproofCommandLine.BadInput;
            }

            probeFactors[channel] = factor;
        }

        var channelUnits = new Dictionary<string, string>(StringComparer.OrdinalIgnoreCase);
        foreach (var item in units)
        {
            if (!TrySplit(item, out var channel, out var text))
            {
                console.Error.WriteLine($"--unit {item}: expected CHANNEL=UNIT, for example CH1=mV.");
                return PatchproofCommandLine.BadInput;
            }

            channelUnits[channel] = text;
        }

        var options = new CaptureReadOptions { ProbeFactors = probeFactors, ChannelUnits = channelUnits };
        var result = CaptureReader.ReadFiles(files, options);
        if (!result.TryGetValue(out var capture))
        {
            foreach (var error in result.Errors)
            {
                console.Error.WriteLine(error.ToString());
            }

            if (json)
            {
                InspectJson.WriteFailure(console.Output, files, result.Errors, result.Warnings);
            }

            return PatchproofCommandLine.BadInput;
        }

        var checks = CaptureInspection.Run(capture);
        if (json)
        {
            InspectJson.Write(console.Output, files, capture, result.Warnings, checks);
        }
        else
        {
            InspectText.Write(console.Output, files, capture, result.Warnings, checks);
        }

        return PatchproofCommandLine.Success;
    }

    private static bool TrySplit(string item, out string channel, out string value)
    {
        var at = item.IndexOf('=', StringComparison.Ordinal);
        channel = at > 0 ? item[..at].Trim() : string.Empty;
        value = at > 0 ? item[(at + 1)..].Trim() : string.Empty;
        return channel.Length > 0 && value.Length > 0;
    }

    private static bool TryParseFactor(string text, out double factor)
    {
        var t = text.Trim().TrimStart('x', 'X').TrimEnd('x', 'X');
        return double.TryParse(t, NumberStyles.Float, CultureInfo.InvariantCulture, out factor) && double.IsFinite(factor) && factor > 0;
    }
}
