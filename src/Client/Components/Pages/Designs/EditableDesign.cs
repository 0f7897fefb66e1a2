using Patchproof.Client.Models;

namespace Patchproof.Client.Components.Pages.Designs;

/// <summary>The mutable copy of a design that the design screen's inputs bind to; <see cref="ToSheet"/> gives the record back.</summary>
public sealed class EditableDesign
{
    /// <summary>The model's name.</summary>
    public string ModelName { get; set; } = "";

    /// <summary>Seconds per problem time unit.</summary>
    public double TimeScaleSeconds { get; set; }

    /// <summary>The blocks, unchanged by the screen.</summary>
    public IReadOnlyList<DesignBlock> Blocks { get; set; } = [];

    /// <summary>The parts, whose values and tolerances the screen edits.</summary>
    public List<EditablePart> Parts { get; set; } = [];

    /// <summary>The design file the sheet stands for, passed back unchanged.</summary>
    public System.Text.Json.JsonElement? Document { get; set; }

    /// <summary>A copy of a design to edit.</summary>
    public static EditableDesign From(DesignSheet sheet) => new()
    {
        Document = sheet.Document,
        ModelName = sheet.ModelName,
        TimeScaleSeconds = sheet.TimeScaleSeconds,
        Blocks = sheet.Blocks,
        Parts = sheet.Parts.Select(p => new EditablePart
        {
            Reference = p.Reference, Kind = p.Kind, Block = p.Block, Nominal = p.Nominal, Unit = p.Unit, TolerancePercent = p.TolerancePercent,
        }).ToList(),
    };

    /// <summary>The edited design with the given equations.</summary>
    public DesignSheet ToSheet(IReadOnlyList<string> equations) => new(
        ModelName, equations, TimeScaleSeconds, Blocks,
        Parts.Select(p => new DesignPart(p.Reference, p.Kind, p.Block, p.Nominal, p.Unit, p.TolerancePercent)).ToList())
    {
        Document = Document,
    };
}

/// <summary>One part being edited.</summary>
public sealed class EditablePart
{
    /// <summary>Its reference designator.</summary>
    public string Reference { get; set; } = "";

    /// <summary>Its kind.</summary>
    public string Kind { get; set; } = "";

    /// <summary>Its block.</summary>
    public string Block { get; set; } = "";

    /// <summary>Its nominal value in <see cref="Unit"/>.</summary>
    public double Nominal { get; set; }

    /// <summary>Its unit.</summary>
    public string Unit { get; set; } = "";

    /// <summary>Its tolerance in percent.</summary>
    public double TolerancePercent { get; set; }
}
