import { Command, type ParseOptionsResult } from 'commander';

/**
 * A command whose text arguments may begin with a minus sign and a digit, as written coordinates do
 * ("-45.3, -131.0"). Commander takes any argument starting with "-" for an option, and accepts only a
 * bare negative number as text; no option of ours starts with a digit, so such an argument is text.
 * @example
 *   program.addCommand(new LocalityCommand('locate').argument('<text>'));
 *   // whereabouts locate "-45.3, -131.0" --country-code QV → text "-45.3, -131.0"
 */
export class LocalityCommand extends Command {
  override parseOptions(args: string[]): ParseOptionsResult {
    const parsed = super.parseOptions(args);
    // Commander stops at the first unknown option and leaves the rest unparsed: take that one back as
    // text when it is a signed number, and parse what follows it again.
    const [first, ...rest] = parsed.unknown;
    if (first === undefined || !/^-\.?\d/.test(first)) return parsed;
    const following = this.parseOptions(rest);
    return { operands: [...parsed.operands, first, ...following.operands], unknown: following.unknown };
  }
}
