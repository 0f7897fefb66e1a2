namespace Patchproof.Cli;

/// <summary>Where a verb writes: its readable output and its error lines (<c>file:line:column: message</c>).</summary>
internal sealed record CliConsole(TextWriter Output, TextWriter Error);
