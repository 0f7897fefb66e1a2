namespace Patchproof.Core;

/// <summary>How serious a diagnostic is.</summary>
public enum DiagnosticSeverity
{
    /// <summary>Worth knowing; nothing was changed or guessed.</summary>
    Info,

    /// <summary>The input was read, but something was recovered from or looks wrong.</summary>
    Warning,

    /// <summary>The input cannot be used as it is.</summary>
    Error,
}

/// <summary>A message about a place in a text input: a file, a line and a column.</summary>
/// <remarks>
/// Lines and columns count from 1; 0 means "the whole line" (column) or "the whole file" (line).
/// <see cref="ToString"/> gives the conventional <c>file:line:column: message</c> form that editors
/// and the command line understand.
/// </remarks>
/// <param name="Severity">How serious the message is.</param>
/// <param name="File">The file name as the person gave it, or null for text that came from no file.</param>
/// <param name="Line">The 1-based line, or 0 when the message concerns the whole input.</param>
/// <param name="Column">The 1-based column, or 0 when the message concerns the whole line.</param>
/// <param name="Message">One sentence a person can act on.</param>
public sealed record SourceDiagnostic(DiagnosticSeverity Severity, string? File, int Line, int Column, string Message)
{
    /// <summary>An error at a place in the input.</summary>
    public static SourceDiagnostic ErrorAt(string? file, int line, int column, string message) =>
        new(DiagnosticSeverity.Error, file, line, column, message);

    /// <summary>A warning at a place in the input.</summary>
    public static SourceDiagnostic WarningAt(string? file, int line, int column, string message) =>
        new(DiagnosticSeverity.Warning, file, line, column, message);

    /// <summary>The <c>file:line:column: message</c> form.</summary>
    public override string ToString() => $"{File ?? "<input>"}:{Line}:{Column}: {Message}";
}

/// <summary>The outcome of reading or parsing an input: a value, or the errors that prevented one.</summary>
/// <remarks>
/// Reading never throws for bad input; it returns a failed result whose <see cref="Errors"/> name
/// where the input went wrong. <see cref="Warnings"/> may accompany a success (what the reader
/// recovered from, such as skipped rows). <see cref="Value"/> throws on a failed result, so check
/// <see cref="Success"/> or use <see cref="TryGetValue"/>.
/// </remarks>
/// <typeparam name="T">The type of the value read.</typeparam>
public sealed class ParseResult<T>
{
    private readonly T? value;

    private ParseResult(T? value, bool success, IReadOnlyList<SourceDiagnostic> errors, IReadOnlyList<SourceDiagnostic> warnings)
    {
        this.value = value;
        Success = success;
        Errors = errors;
        Warnings = warnings;
    }

    /// <summary>True when a value was read.</summary>
    public bool Success { get; }

    /// <summary>The errors that prevented a value; empty on success.</summary>
    public IReadOnlyList<SourceDiagnostic> Errors { get; }

    /// <summary>Warnings and notes about what was read; may be non-empty on success or failure.</summary>
    public IReadOnlyList<SourceDiagnostic> Warnings { get; }

    /// <summary>The value read.</summary>
    /// <exception cref="InvalidOperationException">The input could not be read; the message lists the first error.</exception>
    public T Value => Success
        ? value!
        : throw new InvalidOperationException("The input could not be read: " + (Errors.Count > 0 ? Errors[0].ToString() : "no value"));

    /// <summary>A successful result.</summary>
    /// <param name="value">The value read.</param>
    /// <param name="warnings">What the reader recovered from or noticed, if anything.</param>
    public static ParseResult<T> ForValue(T value, IReadOnlyList<SourceDiagnostic>? warnings = null) =>
        new(value, true, [], warnings ?? []);

    /// <summary>A failed result.</summary>
    /// <param name="errors">At least one error.</param>
    /// <param name="warnings">Warnings gathered before the failure, if any.</param>
    /// <exception cref="ArgumentException"><paramref name="errors"/> is empty.</exception>
    public static ParseResult<T> ForErrors(IReadOnlyList<SourceDiagnostic> errors, IReadOnlyList<SourceDiagnostic>? warnings = null)
    {
        if (errors.Count == 0)
        {
            throw new ArgumentException("A failed result needs at least one error.", nameof(errors));
        }

        return new(default, false, errors, warnings ?? []);
    }

    /// <summary>A failed result with a single error.</summary>
    public static ParseResult<T> ForError(SourceDiagnostic error) => ForErrors([error]);

    /// <summary>Gets the value when there is one.</summary>
    /// <param name="result">The value read, or the default when reading failed.</param>
    /// <returns>True when a value was read.</returns>
    public bool TryGetValue(out T result)
    {
        result = value!;
        return Success;
    }
}
