using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Models.Language;

/// <summary>What a declared name denotes.</summary>
internal enum SymbolKind
{
    State,
    Parameter,
    Constant,
    Input,
    Piecewise,
}

/// <summary>One declared name: its kind, its index among its kind, where it was declared, and its value once known.</summary>
internal sealed record ModelSymbol(string Name, SymbolKind Kind, int Index, int Line, int Column)
{
    public double? Value { get; set; }

    public PiecewiseLinearFunction? Piecewise { get; set; }

    public string Describe() => Kind switch
    {
        SymbolKind.State => "a state",
        SymbolKind.Parameter => "a parameter",
        SymbolKind.Constant => "a constant",
        SymbolKind.Input => "an input",
        _ => "a piecewise-linear function",
    };
}

/// <summary>The names declared in one model text.</summary>
internal sealed class ModelSymbols
{
    private readonly Dictionary<string, ModelSymbol> byName = new(StringComparer.Ordinal);
    private readonly Dictionary<SymbolKind, int> counts = [];

    public bool TryGet(string name, out ModelSymbol symbol) => byName.TryGetValue(name, out symbol!);

    public ModelSymbol Add(string name, SymbolKind kind, int line, int column)
    {
        counts.TryGetValue(kind, out var index);
        counts[kind] = index + 1;
        var symbol = new ModelSymbol(name, kind, index, line, column);
        byName[name] = symbol;
        return symbol;
    }

    public IEnumerable<ModelSymbol> OfKind(SymbolKind kind) => byName.Values.Where(symbol => symbol.Kind == kind).OrderBy(symbol => symbol.Index);
}
