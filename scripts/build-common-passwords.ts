/**
 * Writes server/assets/passwords/common-passwords.txt: the plain-text list of common and leaked
 * passwords the server refuses when someone chooses a new password
 * (server/security/common-passwords.ts). Run `npx tsx scripts/build-common-passwords.ts` after
 * changing the words below, and commit the list.
 *
 * Our own compilation, not a copy of any published file: the words people reach for first
 * (the kind that tops every published tally of leaked passwords — names, pets, teams, love,
 * seasons, keyboard walks, "password" itself), each also with the endings people add to pass a
 * length rule (digits, years, "!"). The short list the forms check in the browser
 * (shared/schemas/weak-passwords.ts) is included. The server also strips endings and undoes
 * letter-for-digit swaps before it looks a password up, so the list holds the base words as well.
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { WEAK_PASSWORDS } from '../shared/schemas/weak-passwords'

const root = fileURLToPath(new URL('..', import.meta.url))
const target = join(root, 'server/assets/passwords/common-passwords.txt')

/** Words and sequences people choose, lowercase, grouped by kind. */
const BASE_WORDS = `
password passw0rd passwort motdepasse contrasena senha parola wachtwoord salasana haslo losenord
secret letmein welcome changeme trustno1 iloveyou loveyou lovely love lover loving sweetheart darling
honey angel angels baby babygirl babyboy princess prince queen king kingdom goddess beautiful pretty
cutie sweetie sexy hottie hotstuff kisses forever always together family friends friend bestfriend
blessed jesus christ god godisgood faith hope heaven hallelujah trinity grace amen angel1 lucky
whatever nothing anything something someone everything hello hellokitty helloworld goodbye thanks
freedom liberty justice peace power money dollar dollars cash rich million success winner victory
champion champ legend hero heroes master mister boss admin administrator root superuser sysadmin
user guest test testing tester demo default login logon access secure security private public
system server network internet computer laptop windows linux apple macintosh iphone android samsung
google facebook instagram twitter youtube linkedin microsoft amazon netflix spotify yahoo hotmail
gmail outlook office mypass mypassword yourpassword newpassword oldpassword temppass temp temporary
qwerty qwertyuiop qwertz azerty asdf asdfgh asdfghjkl zxcvbn zxcvbnm qazwsx qazwsxedc 1qaz2wsx
1q2w3e 1q2w3e4r 1q2w3e4r5t q1w2e3r4 zaq12wsx abc abcd abcdef abcdefg abc123 abcd1234 aaa111
123abc 123qwe qwe123 qweasd qweasdzxc asd123 zxc123 pass pass123 passpass pa55word p4ssword
dragon monkey tiger lion eagle falcon hawk wolf wolves bear bears shark sharks dolphin panther
jaguar leopard cheetah cobra viper python snake spider spiderman superman batman ironman hulk
wolverine joker robin flash thor loki avengers marvel starwars jedi yoda vader skywalker matrix
neo trinity morpheus gandalf frodo hobbit pokemon pikachu mario zelda sonic minecraft fortnite
roblox halo callofduty warcraft starcraft diablo gamer gaming player killer ninja samurai pirate
soldier sniper hunter ranger warrior knight wizard magic merlin phoenix dragonfly butterfly
ladybug bumblebee kitten kitty puppy doggy doggie pussycat cat cats dog dogs horse horses pony
bunny rabbit turtle monkey1 chicken cowboy cowboys buster tigger pepper cookie maggie molly bella
lucy daisy sadie bailey charlie max buddy rocky duke bear1 shadow smokey oreo ginger coco milo
chloe sophie lola luna zoe toby jack jake sam sammy oscar simba nala gizmo muffin snoopy garfield
scooby teddy teddybear sunshine sunflower flower flowers rose roses lily daisy1 tulip orchid
rainbow summer winter spring autumn fall snow snowball snowflake storm thunder lightning rain
ocean sea beach island paradise sunset sunrise moon moonlight star stars starlight galaxy planet
earth world universe cosmos nature forest tree trees river mountain mountains valley canyon desert
football soccer baseball basketball hockey tennis golf golfer rugby cricket boxing racing runner
running skater skate surfer surfing swimming cheer cheerleader dance dancer dancing music musician
guitar drummer drums piano singer rockstar rocknroll metallica nirvana beatles eminem tupac
liverpool chelsea arsenal manchester manutd barcelona realmadrid juventus bayern celtic rangers
yankees redsox dodgers giants cubs lakers celtics bulls warriors packers steelers patriots eagles
raiders broncos dallas chargers dolphins vikings saints bengals ravens jets seahawks falcons
mustang corvette ferrari porsche lamborghini bmw mercedes audi honda toyota nissan subaru jeep
harley yamaha ducati chevy camaro ford mustang1 cadillac lexus tesla
michael jennifer jessica ashley amanda daniel david matthew andrew joshua christopher anthony
thomas robert william richard charles joseph james john johnny jordan justin brandon tyler ryan
nicholas nicole michelle stephanie elizabeth melissa sarah samantha rachel rebecca heather
amber brittany danielle hannah taylor madison emily emma olivia isabella sophia mia abigail
alexander alexandra alexis victoria patrick kevin brian jason eric steven scott mark paul peter
george edward henry frank martin mike chris tom tony alex nick matt dave steve bob bill jim joe
maria mariana carlos jose juan luis miguel pedro antonio francisco manuel jorge fernando
andrea laura sandra monica veronica natalie vanessa jasmine diamond crystal precious chocolate
vanilla caramel candy cupcake cookies pizza pasta cheese banana apple orange lemon cherry
strawberry blueberry pumpkin peanut butter coffee whiskey vodka tequila beer party
hello123 welcome1 letmein1 admin1 root123 test123 guest1 user1 master1 access1 login1
january february march april may june july august september october november december
monday tuesday wednesday thursday friday saturday sunday today tomorrow yesterday weekend holiday
christmas easter halloween birthday valentine newyear
america usa canada mexico brazil england london paris france germany berlin italy spain
australia sydney tokyo china india russia moscow newyork california texas florida chicago boston
seattle portland denver vegas hawaii alaska montana colorado oregon
university college school student teacher doctor nurse police fireman pilot engineer
office work working business company manager employee
wildlife conservation biology biologist genetics genetic rescue habitat species population
ecology ecologist fisheries fishery hatchery salmon trout bison elk deer moose caribou otter
beaver wetland watershed tributary tributarydemo
1234567890 0987654321 123456789 987654321 12345678 87654321 1234567 7654321 123456 654321
12345 54321 1234 4321 123123 321321 112233 111222 121212 123321 147258 147258369 159753
159357 258456 741852963 789456 789456123 963852741 102030 101010 111111 222222 333333 444444
555555 666666 777777 888888 999999 000000 696969 1111111111 0000000000 1212121212 1q2w3e4r5t6y
iloveyou1 iloveu loveme lovelove fuckyou fuckoff asshole bitch bastard shit pussy dick penis
sex sexy1 hornet horny naughty playboy playgirl
`

/** Endings added to reach a length rule, as people add them. */
const ENDINGS = ['', '1', '12', '123', '1234', '12345', '123456', '!', '1!', '123!', '01', '007', '69', '99', '2000', '2010', '2020', '2021', '2022', '2023', '2024', '2025', '2026']

/** Every base word, every base word with every ending, and the short browser-side list. */
function buildList(): string[] {
  const words = new Set(BASE_WORDS.split(/\s+/).map(word => word.trim().toLowerCase()).filter(Boolean))
  const entries = new Set<string>(WEAK_PASSWORDS)
  for (const word of words) {
    for (const ending of ENDINGS) entries.add(`${word}${ending}`)
    entries.add(`${word}${word}`)
  }
  return [...entries].sort()
}

const list = buildList()
const header = [
  '# Common and leaked passwords refused for new passwords (server/security/common-passwords.ts).',
  '# Generated by scripts/build-common-passwords.ts; one lowercase entry a line; "#" lines are comments.',
]
mkdirSync(dirname(target), { recursive: true })
writeFileSync(target, `${[...header, ...list].join('\n')}\n`)
console.log(`wrote ${list.length} entries to ${target}`)
