using System.Text.Json;
using Patchproof.Contracts.Designs;
using Patchproof.Core;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Models;

namespace Patchproof.Server.Designs;

/// <summary>Between a design file and the sheet the design screen edits.</summary>
internal static class DesignSheets
{
    /// <summary>The sheet of a design read from <paramref name="document"/>.</summary>
    public static DesignSheetDocument ToSheet(BoardDesign design, string document)
    {
        var labels = BlockLabels(design);
        var blockOfPart = new Dictionary<string, string>();
        foreach (var block in design.Blocks)
        {
            foreach (var part in PartsOf(block))
            {
                blockOfPart.TryAdd(part, labels[block]);
            }
        }

        using var parsed = JsonDocument.Parse(document, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        return new DesignSheetDocument(
            design.Model?.Name ?? string.Empty,
            EquationsOf(design.Model?.Name),
            design.TimeScaleSeconds,
            design.Blocks.Select(b => new DesignSheetBlock(labels[b], KindOf(b), b.Output)).ToList(),
            design.Parts.Select(p => new DesignSheetPart(p.Id, PartKindText(p.Kind), blockOfPart.GetValueOrDefault(p.Id, string.Empty), p.NominalValue, UnitOf(p.Kind), Math.Round(p.Tolerance * 100, 6))).ToList(),
            parsed.RootElement.Clone());
    }

    /// <summary>The design file of a sheet: its document with the sheet's part values, tolerances and time scale; or the errors, naming the field.</summary>
    public static ParseResult<string> ToDocument(DesignSheetDocument sheet)
    {
        if (sheet.Document is not { ValueKind: JsonValueKind.Object } document)
        {
            return ParseResult<string>.ForError(SourceDiagnostic.ErrorAt("document", 0, 0, "the sheet carries no design file in 'document'"));
        }

        var read = DesignFileReader.Read(document.GetRawText(), "document");
        if (!read.TryGetValue(out var design))
        {
            return ParseResult<string>.ForErrors(read.Errors);
        }

        var errors = new List<SourceDiagnostic>();
        var parts = design.Parts.ToDictionary(p => p.Id);
        for (var i = 0; i < (sheet.Parts ?? []).Count; i++)
        {
            var edit = sheet.Parts![i];
            if (edit is null || !parts.TryGetValue(edit.Reference ?? string.Empty, out var part))
            {
                errors.Add(SourceDiagnostic.ErrorAt($"parts[{i}].reference", 0, 0, $"the design has no part '{edit?.Reference}'"));
                continue;
            }

            if (!(edit.Nominal > 0) || !double.IsFinite(edit.Nominal))
            {
                if (!(part.Kind is PartKind.Reference && double.IsFinite(edit.Nominal) && edit.Nominal != 0))
                {
                    errors.Add(SourceDiagnostic.ErrorAt($"parts[{i}].nominal", 0, 0, $"{edit.Reference}: the nominal value must be a positive number"));
                    continue;
                }
            }

            if (!(edit.TolerancePercent >= 0 && edit.TolerancePercent < 100))
            {
                errors.Add(SourceDiagnostic.ErrorAt($"parts[{i}].tolerancePercent", 0, 0, $"{edit.Reference}: the tolerance must be from 0 to 100 %"));
                continue;
            }

            var tolerance = edit.TolerancePercent / 100;
            // A part whose tolerance the person changed no longer follows its series' class.
            parts[part.Id] = part with { NominalValue = edit.Nominal, Tolerance = tolerance, Series = Math.Abs(tolerance - part.Tolerance) < 1e-12 ? part.Series : null };
        }

        if (!(sheet.TimeScaleSeconds > 0) || !double.IsFinite(sheet.TimeScaleSeconds))
        {
            errors.Add(SourceDiagnostic.ErrorAt("timeScaleSeconds", 0, 0, "the time scale must be a positive number of seconds"));
        }

        if (errors.Count > 0)
        {
            return ParseResult<string>.ForErrors(errors);
        }

        var edited = design with { TimeScaleSeconds = sheet.TimeScaleSeconds, Parts = [.. design.Parts.Select(p => parts[p.Id])] };
        return ParseResult<string>.ForValue(DesignFileWriter.Write(edited));
    }

    /// <summary>The model's equations in the "dx/dt = ..." form over the design's variables, or none for an unknown model.</summary>
    /// <remarks>The library's text when its states are the design target's variables; otherwise the target's terms written out.</remarks>
    public static IReadOnlyList<string> EquationsOf(string? modelName)
    {
        if (modelName is null)
        {
            return [];
        }

        var model = ModelCatalog.Find(modelName);
        var hasTarget = DesignTargets.TryFind(modelName, out var target);
        if (model is not null && (!hasTarget || model.Parse().StateNames.SequenceEqual(target.Variables)))
        {
            return model.EquationText.Split('\n')
                .Select(line => line.Trim())
                .Where(line => !line.StartsWith('#') && line.Contains("' =", StringComparison.Ordinal))
                .Select(line =>
                {
                    var prime = line.IndexOf("' =", StringComparison.Ordinal);
                    return $"d{line[..prime]}/dt = {line[(prime + 3)..].Trim()}";
                })
                .ToList();
        }

        return hasTarget ? target.Variables.Select(v => $"d{v}/dt = {Written(target.Terms.Where(t => t.Variable == v))}").ToList() : [];
    }

    private static string Written(IEnumerable<TargetTerm> terms)
    {
        var text = new System.Text.StringBuilder();
        foreach (var term in terms)
        {
            var magnitude = Math.Abs(term.Factor);
            var factors = new List<string>();
            if (magnitude != 1)
            {
                factors.Add(magnitude.ToString("0.###", System.Globalization.CultureInfo.InvariantCulture));
            }

            if (term.Parameter is not null)
            {
                factors.Add(term.Parameter);
            }

            factors.AddRange(term.Basis.Variables);
            text.Append(term.Factor < 0 ? (text.Length == 0 ? "-" : " - ") : (text.Length == 0 ? string.Empty : " + "));
            text.Append(factors.Count == 0 ? "1" : string.Join("*", factors));
        }

        return text.Length == 0 ? "0" : text.ToString();
    }

    private static Dictionary<DesignBlock, string> BlockLabels(BoardDesign design)
    {
        var counts = new Dictionary<char, int>();
        var labels = new Dictionary<DesignBlock, string>(ReferenceEqualityComparer.Instance);
        foreach (var block in design.Blocks)
        {
            var letter = block switch
            {
                IntegratorBlock => 'I',
                SummerBlock { IsInverter: true } => 'N',
                SummerBlock => 'S',
                MultiplierBlock => 'M',
                ReferenceBlock => 'V',
                _ => 'F',
            };
            counts[letter] = counts.GetValueOrDefault(letter) + 1;
            labels[block] = $"{letter}{counts[letter]}";
        }

        return labels;
    }

    private static IEnumerable<string> PartsOf(DesignBlock block) => block switch
    {
        IntegratorBlock i => [i.CapacitorId, .. i.Inputs.Select(input => input.ResistorId)],
        SummerBlock s => [s.FeedbackResistorId, .. s.Inputs.Select(input => input.ResistorId)],
        MultiplierBlock m => [m.PartId],
        ReferenceBlock r => [r.PartId],
        _ => [],
    };

    private static string KindOf(DesignBlock block) => block switch
    {
        IntegratorBlock => "integrator",
        SummerBlock { IsInverter: true } => "inverter",
        SummerBlock => "summer",
        MultiplierBlock => "multiplier",
        ReferenceBlock => "reference",
        _ => "function",
    };

    private static string PartKindText(PartKind kind) => kind switch
    {
        PartKind.Resistor => "resistor",
        PartKind.Capacitor => "capacitor",
        PartKind.Multiplier => "scale",
        _ => "reference",
    };

    private static string UnitOf(PartKind kind) => kind switch
    {
        PartKind.Resistor => "Ohm",
        PartKind.Capacitor => "F",
        PartKind.Multiplier => "1/V",
        _ => "V",
    };
}
