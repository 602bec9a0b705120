import type { AppContext } from '../context';
import type { DemoUsers } from './demo';
import { DEMO_CONNECTOR_SLUGS, type DemoConnectorKey } from './connectors';
import { renderReply } from '../services/replies';
import { setSubscription } from '../services/subscriptions';
import { notify } from '../services/notifications';

const HOUR = 60 * 60 * 1000;

interface DemoReply {
  by: string;
  body: string;
  hoursAgo: number;
  answer?: boolean;
  children?: DemoReply[];
}

/** Invented conversations under some demo sheets, by sheet key. */
const THREADS: Partial<Record<DemoConnectorKey, DemoReply[]>> = {
  coolantSensor: [
    {
      by: 'tobin.arkwell@example.test',
      hoursAgo: 70,
      body: 'Does cavity **B** really share its low reference with the intake air temperature sensor, or does it run back to the module on its own on the later builds?',
      children: [
        {
          by: 'sable.wren@example.test',
          hoursAgo: 66,
          answer: true,
          body: 'On the harness I probed it is shared: BN/WH splits about 10 cm from the plug. Check continuity with the battery disconnected before you trust that for your build year.',
        },
        {
          by: 'tobin.arkwell@example.test',
          hoursAgo: 64,
          body: 'Found the splice where you said. Thanks!',
        },
      ],
    },
    {
      by: 'pell.marrow@example.test',
      hoursAgo: 30,
      body: 'Thank you for printing the view side on the drawing. My last plug was mirrored because the sheet I used did not say.',
    },
  ],
  pedalSensor: [
    {
      by: 'member2@example.test',
      hoursAgo: 50,
      body: 'Are the two 5 V references fed separately inside the module? I would like to splice them to save a wire in my adapter.',
      children: [
        {
          by: 'member@example.test',
          hoursAgo: 47,
          answer: true,
          body: 'Please do not splice them. The two tracks check each other, so each has its own supply and low reference. A shared fault would look like a plausible pedal position.',
        },
      ],
    },
  ],
  injector: [
    {
      by: 'sable.wren@example.test',
      hoursAgo: 20,
      body: 'Which way round does the **switched ignition feed** go? Is cavity 1 marked on the housing itself?',
    },
  ],
};

/**
 * The demo step for replies: a few conversations between the invented members, with
 * answers marked and the writers subscribed. Sends no e-mail; leaves a couple of unread
 * notices in member@'s bell.
 */
export async function seedReplies(ctx: AppContext, users: DemoUsers) {
  const { Document, Reply } = ctx.models;
  for (const [key, thread] of Object.entries(THREADS) as Array<[DemoConnectorKey, DemoReply[]]>) {
    const doc = await Document.findOne({ where: { slug: DEMO_CONNECTOR_SLUGS[key] } });
    if (!doc?.publishedRevisionId) continue;
    await ctx.sequelize.transaction(async (transaction) => {
      const write = async (r: DemoReply, parentId: number | null) => {
        const author = users[r.by];
        const at = new Date(Date.now() - r.hoursAgo * HOUR);
        const row = await Reply.create(
          {
            documentId: doc.id,
            authorId: author.id,
            parentId,
            body: r.body,
            bodyHtml: renderReply(r.body),
            isAnswer: !!r.answer,
            createdAt: at,
            updatedAt: at,
          },
          { transaction, silent: true },
        );
        if (author.id !== doc.ownerId)
          await setSubscription(doc.id, author.id, true, 'replied', transaction);
        if (doc.ownerId === users['member@example.test'].id && author.id !== doc.ownerId)
          await notify(
            {
              userId: doc.ownerId,
              kind: 'reply',
              title: `${author.displayName} replied under your sheet`,
              body: r.body,
              link: `/documents/${doc.slug}#reply-${row.id}`,
            },
            transaction,
          );
        return row;
      };
      for (const top of thread) {
        const parent = await write(top, null);
        for (const child of top.children ?? []) await write(child, parent.id);
      }
    });
  }
}
